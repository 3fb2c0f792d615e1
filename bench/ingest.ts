/**
 * `npm run bench:ingest [-- --no-build] [--count 2000] [--concurrency 8] [--samples 1000] [--profile DIR]`
 *
 * Builds a production server into .next-bench (unless --no-build), starts it on a free port against a fresh
 * migrated SQLite file, posts signed candidates with 1000-sample tracks at concurrency 8 and prints latency
 * percentiles and throughput; then writes the same rows straight through the libSQL client (same tables, same
 * transaction shape, derived quantities precomputed) and prints the overhead ratio. Figures only, no assertions.
 * It also posts the same bodies with a wrong signature (read, HMAC, 401) as the floor any route pays, and prints
 * server and client CPU per post with the rate they allow on this machine's cores.
 * `--profile DIR` also writes CPU profiles of the server (one per thread) into DIR.
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { Agent, request } from "node:http";
import { createServer } from "node:net";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import webpush from "web-push";
import { openDatabase } from "@/db/client";
import { migrateDatabase } from "@/db/migrate";
import { FeedGenerator, type FeedPost } from "@/fakes/feed/generator";
import { signFeedBody } from "@/lib/feed/signature";
import { insertDirect, precomputeRows } from "./ingest-direct";

const { values } = parseArgs({
  options: {
    "no-build": { type: "boolean", default: false },
    count: { type: "string", default: "2000" },
    concurrency: { type: "string", default: "8" },
    samples: { type: "string", default: "1000" },
    // Writes V8 CPU profiles of the server's threads into this folder (node --cpu-prof), for finding hot spots.
    profile: { type: "string" },
  },
});
const count = Number(values.count);
const concurrency = Number(values.concurrency);
const distDir = ".next-bench";

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once("error", reject);
    server.listen(0, "127.0.0.1", () => {
      const address = server.address();
      server.close(() => (typeof address === "object" && address ? resolve(address.port) : reject(new Error("no port"))));
    });
  });
}

/** utime + stime of a /proc stat line, in seconds (clock ticks of 1/100 s); the name may hold spaces and ")". */
function statCpuSeconds(stat: string): number {
  const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
  return (Number(fields[11]) + Number(fields[12])) / 100;
}

/** CPU seconds (user + system) a process has used so far, from /proc (Linux). */
function processCpuSeconds(pid: number): number {
  try {
    return statCpuSeconds(readFileSync(`/proc/${pid}/stat`, "utf8"));
  } catch {
    return Number.NaN;
  }
}

/** CPU seconds of each thread of a process, keyed by "name/tid" (Linux /proc/<pid>/task). */
function threadCpuSeconds(pid: number): Map<string, number> {
  const out = new Map<string, number>();
  try {
    for (const tid of readdirSync(`/proc/${pid}/task`)) {
      const stat = readFileSync(`/proc/${pid}/task/${tid}/stat`, "utf8");
      out.set(`${stat.slice(stat.indexOf("(") + 1, stat.lastIndexOf(")"))}/${tid}`, statCpuSeconds(stat));
    }
  } catch {
    // not Linux, or the process is gone
  }
  return out;
}

function percentile(sorted: number[], p: number): number {
  const index = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[index] ?? Number.NaN;
}

/** New candidates only (the generator also makes revisions; they are skipped so every post creates one). */
function makePosts(): FeedPost[] {
  const start = Date.now() - (count + 10) * 1000;
  const generators = (["bns", "nsbh", "bbh"] as const).map(
    (scenario) => new FeedGenerator({ seed: `bench/${scenario}`, scenario, sites: ["N1", "S1", "E1"], trackSamples: Number(values.samples) }),
  );
  const posts: FeedPost[] = [];
  const seen = new Set<string>();
  for (let i = 0; posts.length < count; i++) {
    const post = generators[i % 3]?.next(start + posts.length * 1000);
    if (!post?.payload || post.kind !== "new") continue;
    const key = `${post.payload.source}/${post.payload.externalId}`;
    if (seen.has(key)) continue;
    seen.add(key);
    posts.push(post);
  }
  return posts;
}

async function waitForServer(baseUrl: string, server: ChildProcess): Promise<void> {
  const deadline = Date.now() + 60_000;
  while (Date.now() < deadline) {
    if (server.exitCode !== null) throw new Error(`next start exited with ${server.exitCode}`);
    try {
      const res = await fetch(`${baseUrl}/api/v1/openapi.json`);
      if (res.status === 401 || res.status === 200) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error("server did not come up within 60 s");
}

/**
 * One signed POST over a kept-alive connection with node:http, answering the status once the body is read. The
 * client shares the machine's cores with the server, so it uses the lightest client Node has (fetch costs about
 * 2 ms of CPU per 25 KB post here, node:http a fraction of that).
 */
function postOnce(agent: Agent, baseUrl: string, body: string, signature: Record<string, string>): Promise<{ status: number; outcome: string }> {
  return new Promise((resolve, reject) => {
    const req = request(
      `${baseUrl}/api/v1/feed/candidates`,
      {
        method: "POST",
        agent,
        headers: { "content-type": "application/json", "content-length": Buffer.byteLength(body), ...signature },
      },
      (res) => {
        // Only the answer's tail is kept: "outcome" is its last field (created, joined, …).
        let tail = "";
        res.on("data", (chunk: Buffer) => void (tail = (tail + chunk.toString("latin1")).slice(-64)));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, outcome: /"outcome":"(\w+)"/.exec(tail)?.[1] ?? "-" }));
        res.on("error", reject);
      },
    );
    req.on("error", reject);
    req.end(body);
  });
}

async function postAll(baseUrl: string, posts: FeedPost[], secret: string) {
  const agent = new Agent({ keepAlive: true, maxSockets: concurrency });
  const latencies: number[] = [];
  const statuses = new Map<number, number>();
  const outcomes = new Map<string, number>();
  let next = 0;
  const worker = async () => {
    while (next < posts.length) {
      const post = posts[next++];
      if (!post) break;
      const started = performance.now();
      const { status, outcome } = await postOnce(agent, baseUrl, post.rawBody, signFeedBody(secret, post.rawBody, Date.now()));
      latencies.push(performance.now() - started);
      statuses.set(status, (statuses.get(status) ?? 0) + 1);
      outcomes.set(outcome, (outcomes.get(outcome) ?? 0) + 1);
    }
  };
  const started = performance.now();
  await Promise.all(Array.from({ length: concurrency }, worker));
  const wallMs = performance.now() - started;
  agent.destroy();
  return { latencies, statuses, outcomes, wallMs };
}

async function main(): Promise<void> {
  const work = mkdtempSync(path.join(tmpdir(), "chirpdesk-bench-ingest-"));
  const secret = randomBytes(32).toString("base64url");
  const vapid = webpush.generateVAPIDKeys();
  let server: ChildProcess | undefined;
  try {
    const databaseUrl = `file:${path.join(work, "served.db")}`;
    const served = await openDatabase(databaseUrl);
    await migrateDatabase(served);
    served.$client.close();
    const port = await freePort();
    const baseUrl = `http://127.0.0.1:${port}`;
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      NODE_ENV: "production",
      NEXT_DIST_DIR: distDir,
      NEXT_TELEMETRY_DISABLED: "1",
      DATABASE_URL: databaseUrl,
      NEXTAUTH_URL: baseUrl,
      NEXTAUTH_SECRET: randomBytes(32).toString("base64url"),
      FEED_SIGNING_SECRET: secret,
      ACK_LINK_SECRET: randomBytes(32).toString("base64url"),
      VAPID_PUBLIC_KEY: vapid.publicKey,
      VAPID_PRIVATE_KEY: vapid.privateKey,
      VAPID_SUBJECT: "mailto:bench@example.test",
      // Nothing is sent in this bench; a closed port makes any attempt fail fast.
      SMTP_URL: "smtp://127.0.0.1:1",
      MAIL_FROM: "Chirpdesk bench <bench@example.test>",
      UPLOAD_DIR: path.join(work, "uploads"),
    };
    if (!values["no-build"]) {
      console.log(`building into ${distDir} …`);
      // `next build` rewrites these two shared files to point at its own dist dir; put them back afterwards.
      const kept = ["tsconfig.json", "next-env.d.ts"].filter(existsSync).map((file) => [file, readFileSync(file, "utf8")] as const);
      const build = spawnSync(process.execPath, ["node_modules/next/dist/bin/next", "build"], { env, stdio: "inherit" });
      for (const [file, text] of kept) writeFileSync(file, text);
      if (build.status !== 0) throw new Error(`next build failed (exit ${build.status}); rerun once the tree compiles`);
    }
    console.log(`generating ${count} candidates with ${values.samples}-sample tracks …`);
    const posts = makePosts();
    const meanBytes = posts.reduce((sum, p) => sum + p.rawBody.length, 0) / posts.length;

    const profileFlags = values.profile ? ["--cpu-prof", `--cpu-prof-dir=${path.resolve(values.profile)}`] : [];
    server = spawn(process.execPath, [...profileFlags, "node_modules/next/dist/bin/next", "start", "-p", String(port)], {
      env,
      detached: true,
      stdio: ["ignore", "ignore", "inherit"],
    });
    await waitForServer(baseUrl, server);
    // Warm-up outside the measurement: first-request compilation and JIT.
    const warm = makePostsForWarmup();
    await postAll(baseUrl, warm, secret);

    const serverPid = server.pid ?? 0;
    const cpuBefore = processCpuSeconds(serverPid);
    const clientCpuBefore = process.cpuUsage();
    const threadsBefore = threadCpuSeconds(serverPid);
    const served2 = await postAll(baseUrl, posts, secret);
    const serverCpuMs = ((processCpuSeconds(serverPid) - cpuBefore) * 1000) / posts.length;
    const clientCpu = process.cpuUsage(clientCpuBefore);
    const threadsAfter = threadCpuSeconds(serverPid);
    const busiestThreads = [...threadsAfter]
      .map(([key, seconds]) => [key, ((seconds - (threadsBefore.get(key) ?? 0)) * 1000) / posts.length] as const)
      .filter(([, ms]) => ms >= 0.05)
      .sort((a, b) => b[1] - a[1])
      .slice(0, 4);
    const clientCpuMs = (clientCpu.user + clientCpu.system) / 1000 / posts.length;
    const sorted = [...served2.latencies].sort((a, b) => a - b);
    const throughput = (posts.length / served2.wallMs) * 1000;
    console.log("\nHTTP ingest (next start, production build)");
    console.log(`  posts            ${posts.length} at concurrency ${concurrency}, mean body ${(meanBytes / 1024).toFixed(1)} KiB`);
    console.log(`  statuses         ${[...served2.statuses].map(([s, n]) => `${s}×${n}`).join(", ")}`);
    // Grouping is on: a post whose event time falls within the coincidence window of an earlier one joins it.
    console.log(`  outcomes         ${[...served2.outcomes].map(([o, n]) => `${o}×${n}`).join(", ")}`);
    console.log(`  latency p50      ${percentile(sorted, 50).toFixed(1)} ms`);
    console.log(`  latency p99      ${percentile(sorted, 99).toFixed(1)} ms`);
    console.log(`  latency max      ${(sorted.at(-1) ?? Number.NaN).toFixed(1)} ms`);
    console.log(`  throughput       ${throughput.toFixed(0)} candidates/s (wall ${(served2.wallMs / 1000).toFixed(2)} s)`);
    console.log(`  server CPU       ${serverCpuMs.toFixed(1)} ms per candidate (user + system, all threads, from /proc)`);
    console.log(`    by thread      ${busiestThreads.map(([key, ms]) => `${key.split("/")[0]} ${ms.toFixed(1)}`).join(", ")} (ms per candidate)`);
    console.log(`  client CPU       ${clientCpuMs.toFixed(1)} ms per candidate (this process: signing and posting)`);
    // Server and client share this machine's cores, so CPU alone caps the rate however the work is spread.
    const ceiling = (cpus().length * 1000) / (serverCpuMs + clientCpuMs);
    console.log(`  CPU ceiling      ${ceiling.toFixed(0)} candidates/s (${cpus().length} cores ÷ server + client CPU per candidate)`);

    // The floor under any route: the same posts signed with a wrong secret are read whole, their HMAC checked and
    // answered 401, with no JSON, validation, physics or database. What Next, HTTP and the body cost by themselves.
    const floorCpuBefore = processCpuSeconds(serverPid);
    const floor = await postAll(baseUrl, posts, `${secret}-wrong`);
    const floorCpuMs = ((processCpuSeconds(serverPid) - floorCpuBefore) * 1000) / posts.length;
    console.log("\nFloor: the same posts with a wrong signature (body read, HMAC checked, 401; nothing else)");
    console.log(`  statuses         ${[...floor.statuses].map(([s, n]) => `${s}×${n}`).join(", ")}`);
    console.log(`  throughput       ${((posts.length / floor.wallMs) * 1000).toFixed(0)} posts/s; server CPU ${floorCpuMs.toFixed(1)} ms per post`);

    console.log("\nprecomputing derived quantities for the direct insert (not timed) …");
    const rows = await precomputeRows(posts);
    const directUrl = `file:${path.join(work, "direct.db")}`;
    const direct = await openDatabase(directUrl);
    await migrateDatabase(direct);
    const directCpu = process.cpuUsage();
    const directMs = await insertDirect(direct.$client, rows);
    const { user, system } = process.cpuUsage(directCpu);
    direct.$client.close();
    const directRate = (rows.length / directMs) * 1000;
    console.log("\nDirect libSQL inserts (one write transaction per candidate, same tables and statements)");
    console.log(`  time             ${directMs.toFixed(0)} ms for ${rows.length} (${(directMs / rows.length).toFixed(2)} ms each)`);
    console.log(`  throughput       ${directRate.toFixed(0)} candidates/s`);
    console.log(`  CPU              ${((user + system) / 1000 / rows.length).toFixed(2)} ms per candidate`);
    console.log(`\noverhead ratio (HTTP wall time / direct time)  ${(served2.wallMs / directMs).toFixed(2)}×`);
    console.log("targets from the issue: p99 < 50 ms, ≥ 300 candidates/s, overhead < 3×");
    console.log(`load average at the end: ${loadavg().map((l) => l.toFixed(1)).join(" ")} on ${cpus().length} CPUs (other work on the machine skews wall-clock figures)`);
  } finally {
    if (server?.pid) {
      try {
        process.kill(-server.pid, "SIGTERM");
        // A profiled server writes its profiles on the way out.
        if (values.profile) await new Promise((resolve) => server?.once("exit", resolve));
      } catch {
        // already gone
      }
    }
    rmSync(work, { recursive: true, force: true });
  }

  function makePostsForWarmup(): FeedPost[] {
    const generator = new FeedGenerator({ seed: "bench/warm-up", scenario: "bbh", sites: ["N1", "S1"], trackSamples: 200 });
    return Array.from({ length: 40 }, (_, i) => generator.next(Date.now() - 3_600_000 + i * 1000)).filter((p) => p.kind === "new");
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
