/**
 * The fake detector feed: posts invented candidates to a running Chirpdesk.
 *   npm run feed -- --rate 2/min --count 50 --seed 7 --scenario mixed --url http://localhost:3000
 * Scenarios: gentle | mixed | bns | nsbh | bbh | early-warning | malformed | bad-signature. Without --count it runs
 * until Ctrl-C. `gentle` (what `npm run dev` starts) reads --rate as new signals per time (default 6/h), sends
 * other pipelines' reports, first looks and the odd revision in between, and attaches one of the demo sky maps in
 * --skymaps (default fakes/feed/skymaps for gentle, `none` for no maps) to about half of the signals. The other
 * scenarios read --rate as posts per time. The signing secret comes from FEED_SIGNING_SECRET (environment or
 * .env.local); the URL from --url, APP_URL or NEXTAUTH_URL.
 */
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { networkSiteCodes } from "@/lib/feed/network";
import { FeedGenerator, scenarios, type Scenario } from "./generator";
import { loadEnvFile, parseRate } from "./config";
import { FeedPacer } from "./pacing";
import { sendSkymap, sendWithRetry, sleep, type PostOutcome } from "./poster";

const defaultSkymapDir = path.join(path.dirname(new URL(import.meta.url).pathname), "skymaps");

/** The demo sky maps in a folder (file names, sorted so a seed picks the same ones everywhere). */
function readSkymapFiles(dir: string | undefined): Map<string, Uint8Array> {
  const files = new Map<string, Uint8Array>();
  if (!dir || dir === "none") return files;
  for (const name of readdirSync(dir).filter((n) => n.endsWith(".fits") || n.endsWith(".fits.gz")).sort()) {
    files.set(name, new Uint8Array(readFileSync(path.join(dir, name))));
  }
  return files;
}

function describeOutcome(outcome: PostOutcome): string {
  const body = outcome.body as { id?: string; outcome?: string; error?: string; area90Deg2?: number } | string;
  if (typeof body === "string") return body.slice(0, 120).trim();
  if (body.area90Deg2 !== undefined) return `90 % area ${body.area90Deg2.toFixed(0)} deg²`;
  return (body.error ?? `${body.outcome ?? ""} ${body.id ?? ""}`).trim();
}

async function main(): Promise<void> {
  loadEnvFile(path.resolve(process.cwd(), ".env.local"));
  const { values } = parseArgs({
    options: {
      rate: { type: "string", default: "2/min" },
      count: { type: "string" },
      seed: { type: "string" },
      scenario: { type: "string", default: "mixed" },
      url: { type: "string" },
      samples: { type: "string", default: "400" },
      skymaps: { type: "string" },
    },
  });
  const scenario = values.scenario as Scenario;
  if (!scenarios.includes(scenario)) throw new Error(`--scenario must be one of ${scenarios.join(", ")}`);
  const gentle = scenario === "gentle";
  const intervalMs = parseRate(values.rate ?? (gentle ? "6/h" : "2/min"));
  const count = values.count === undefined ? Number.POSITIVE_INFINITY : Number(values.count);
  if (!(count >= 0)) throw new Error("--count must be a number");
  const seed = values.seed ?? String(Date.now());
  const baseUrl = values.url ?? process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://localhost:3000";
  const secret = process.env.FEED_SIGNING_SECRET;
  if (!secret) throw new Error("FEED_SIGNING_SECRET is not set (environment or .env.local)");

  const skymaps = readSkymapFiles(values.skymaps ?? (gentle ? defaultSkymapDir : undefined));
  const generator = new FeedGenerator({
    seed,
    scenario,
    sites: networkSiteCodes(),
    trackSamples: Number(values.samples),
    skymapFiles: [...skymaps.keys()],
  });
  const pacer = gentle ? new FeedPacer(generator, { candidatesPerHour: 3_600_000 / intervalMs, seed }) : null;
  const stop = new AbortController();
  process.once("SIGINT", () => stop.abort());
  process.once("SIGTERM", () => stop.abort());
  const rateText = `${values.rate ?? (gentle ? "6/h" : "2/min")}${gentle ? " new signals" : ""}`;
  const mapsText = skymaps.size > 0 ? `, ${skymaps.size} demo sky maps` : "";
  console.log(`[feed] ${scenario} at ${rateText} to ${baseUrl}, seed ${seed}${mapsText}${Number.isFinite(count) ? `, ${count} posts` : ""}`);

  let sent = 0;
  while (sent < count && !stop.signal.aborted) {
    let post = null;
    let nextAtMs = Date.now() + intervalMs;
    if (pacer) ({ post, nextAtMs } = pacer.step(Date.now()));
    else post = generator.next(Date.now());
    if (post) {
      const outcome = await sendWithRetry(baseUrl, post, secret, { signal: stop.signal, log: (line) => console.log(line) });
      if (!outcome) break;
      sent += 1;
      const expected = post.expectedStatuses.includes(outcome.status) ? "" : ` (expected ${post.expectedStatuses.join("/")})`;
      console.log(`[feed] ${outcome.status}${expected} ${post.description}: ${describeOutcome(outcome)} (${outcome.elapsedMs.toFixed(0)} ms)`);
      const map = post.skymapFile ? skymaps.get(post.skymapFile) : undefined;
      if (map && post.payload && outcome.status === 201) {
        try {
          const attached = await sendSkymap(baseUrl, post.payload, { name: post.skymapFile ?? "map.fits.gz", bytes: map }, secret);
          console.log(`[feed] ${attached.status} sky map ${post.skymapFile} for ${post.payload.externalId}: ${describeOutcome(attached)}`);
        } catch (error) {
          console.log(`[feed] sky map ${post.skymapFile} not sent: ${(error as Error).message}`);
        }
      }
      // Another pipeline's report of the same signal follows within seconds, not at the feed's rate.
      if (!pacer) nextAtMs = Date.now() + (generator.peekCompanion() ? Math.min(intervalMs, 1_500) : intervalMs);
    }
    if (sent < count) await sleep(Math.max(0, nextAtMs - Date.now()), stop.signal);
  }
  console.log(`[feed] stopped after ${sent} posts`);
}

main().catch((error: unknown) => {
  console.error(`[feed] ${(error as Error).message}`);
  process.exit(1);
});
