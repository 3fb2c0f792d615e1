/**
 * Triage board with 500 cards, production build, headless Chromium. Prints (no assertions):
 *  - time from navigation start to the board being interactive (the `data-board-ready` marker the board sets
 *    after hydration, when every card is draggable), median and range over several loads;
 *  - first-load JavaScript of the board route: the gzip size of every script the page loaded by then.
 * Usage: npm run bench:board   (BENCH_SKIP_BUILD=1 reuses .next-bench-board; BENCH_CARDS=500; BENCH_RUNS=5)
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { gzipSync } from "node:zlib";
import type { Response as PlaywrightResponse } from "playwright-core";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { findUserByEmail, seedDemo } from "@/scripts/demo/demo";
import { seedBoardCandidates } from "@/tests/support/seed-board";
import { launchBrowser } from "@/tests/support/browser";
import { freePort, productionEnv, startProcess, stopProcess, waitForHttp } from "@/tests/support/server";

const distDir = ".next-bench-board";
const cards = Number(process.env.BENCH_CARDS ?? 500);
const runs = Number(process.env.BENCH_RUNS ?? 5);

function build(): void {
  if (process.env.BENCH_SKIP_BUILD === "1" && existsSync(path.join(distDir, "BUILD_ID"))) return;
  // `next build` rewrites these two tracked files for its own folder; put them back afterwards.
  const kept = ["tsconfig.json", "next-env.d.ts"].map((file) => [file, readFileSync(file, "utf8")] as const);
  const started = Date.now();
  try {
    execFileSync("node", ["node_modules/next/dist/bin/next", "build"], {
      stdio: ["ignore", "ignore", "inherit"],
      env: { ...process.env, NEXT_DIST_DIR: distDir, NEXT_TELEMETRY_DISABLED: "1", NODE_ENV: "production" },
    });
  } finally {
    for (const [file, text] of kept) writeFileSync(file, text);
  }
  console.log(`build: ${((Date.now() - started) / 1000).toFixed(1)} s`);
}

async function seed(databaseUrl: string): Promise<void> {
  process.env.DATABASE_URL = databaseUrl;
  const db = await getDb();
  await migrateDatabase(db);
  await seedDemo(db);
  const ada = await findUserByEmail(db, "ada@chirpdesk.test");
  if (!ada) throw new Error("demo seed has no shifter");
  const started = Date.now();
  await seedBoardCandidates(cards, new Date(), { id: ada.id, email: ada.email, name: ada.name, role: ada.role, timeZone: ada.timeZone, initials: ada.initials }, "BB");
  console.log(`seeded ${cards} candidates through ingest in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  await closeDb();
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? Number.NaN;

build();
const work = mkdtempSync(path.join(tmpdir(), "chirpdesk-bench-board-"));
const databaseUrl = `file:${path.join(work, "bench.db")}`;
await seed(databaseUrl);
const port = await freePort();
// Every variable the server checks, generated here, so the benchmark runs on a fresh clone without .env.local.
// No worker runs, so nothing is mailed: the SMTP address only has to parse.
const env = productionEnv({ port, databaseUrl, smtpPort: 2, distDir });
const server = startProcess("node", ["node_modules/next/dist/bin/next", "start", "-p", String(port)], env, "bench");
const base = `http://localhost:${port}`;
const browser = await launchBrowser({ viewport: { width: 1440, height: 900 } });
try {
  await waitForHttp(`${base}/sign-in`);
  const page = await browser.context.newPage();
  await page.goto(`${base}/sign-in`);
  await page.fill("#email", "ada@chirpdesk.test");
  await page.fill("#password", "demo-shifter");
  await page.click("button[type=submit]");
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 60_000 });

  const times: Record<"cold" | "warm", Array<{ ready: number; ttfb: number; html: number; dcl: number }>> = { cold: [], warm: [] };
  const scripts = new Map<string, number>();
  let documentGzip = 0;
  const cdp = await browser.context.newCDPSession(page);
  const plan: Array<"first" | "cold" | "warm"> = ["first", ...Array<"cold">(runs).fill("cold"), ...Array<"warm">(runs).fill("warm")];
  for (const phase of plan) {
    const seen = new Set<string>();
    const onResponse = (response: PlaywrightResponse) => {
      if (response.request().resourceType() === "script") seen.add(response.url());
    };
    page.on("response", onResponse);
    await cdp.send("Network.setCacheDisabled", { cacheDisabled: phase !== "warm" });
    await page.goto(`${base}/triage`, { waitUntil: "commit" });
    const readyAt = await page.waitForFunction(
      () => (document.querySelector('[data-board-ready="true"]') ? performance.now() : false),
      undefined,
      { polling: "raf", timeout: 60_000 },
    );
    const ready = Number(await readyAt.jsonValue());
    const nav = await page.evaluate(() => {
      const entry = performance.getEntriesByType("navigation")[0] as PerformanceNavigationTiming | undefined;
      return entry ? { ttfb: entry.responseStart, html: entry.responseEnd, dcl: entry.domContentLoadedEventEnd } : { ttfb: NaN, html: NaN, dcl: NaN };
    });
    page.off("response", onResponse);
    if (phase === "first") {
      // The first load counts what the page fetched; it is not timed (cold server caches).
      for (const url of seen) {
        const body = Buffer.from(await (await fetch(url)).arrayBuffer());
        scripts.set(url, gzipSync(body).length);
      }
      const cookies = (await browser.context.cookies()).map((c) => `${c.name}=${c.value}`).join("; ");
      documentGzip = gzipSync(Buffer.from(await (await fetch(`${base}/triage`, { headers: { cookie: cookies } })).arrayBuffer())).length;
      console.log(`cards rendered on the board: ${await page.locator("[data-testid=triage-card]").count()}`);
    } else {
      times[phase].push({ ready, ...nav });
    }
  }
  for (const phase of ["cold", "warm"] as const) {
    const rows = times[phase];
    const xs = rows.map((r) => r.ready);
    const what = phase === "cold" ? "browser cache off" : "browser cache on";
    console.log(`navigation → board interactive, ${what} (${xs.length} loads, warm server):`);
    console.log(`  median ${median(xs).toFixed(0)} ms, min ${Math.min(...xs).toFixed(0)} ms, max ${Math.max(...xs).toFixed(0)} ms`);
    const part = (key: "ttfb" | "html" | "dcl") => median(rows.map((r) => r[key])).toFixed(0);
    console.log(`  medians: first byte ${part("ttfb")} ms, HTML done ${part("html")} ms, DOMContentLoaded ${part("dcl")} ms`);
  }
  const totalGzip = [...scripts.values()].reduce((a, b) => a + b, 0);
  console.log(`first-load JavaScript of /triage: ${(totalGzip / 1024).toFixed(1)} kB gzipped in ${scripts.size} scripts`);
  for (const [url, size] of [...scripts.entries()].sort((a, b) => b[1] - a[1])) {
    console.log(`  ${(size / 1024).toFixed(1).padStart(6)} kB  ${new URL(url).pathname}`);
  }
  console.log(`HTML document with the 500-card payload: ${(documentGzip / 1024).toFixed(1)} kB gzipped`);
  console.log("targets (issue 5): under 1000 ms and under 200 kB gzipped");
} finally {
  await browser.close();
  stopProcess(server);
  rmSync(work, { recursive: true, force: true });
}
