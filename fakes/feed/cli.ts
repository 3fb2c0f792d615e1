/**
 * The fake detector feed: posts invented candidates to a running Chirpdesk.
 *   npm run feed -- --rate 2/min --count 50 --seed 7 --scenario mixed --url http://localhost:3000
 * Scenarios: mixed | bns | nsbh | bbh | early-warning | malformed | bad-signature. Without --count it runs until
 * Ctrl-C. The signing secret comes from FEED_SIGNING_SECRET (environment or .env.local); the URL from --url,
 * APP_URL or NEXTAUTH_URL.
 */
import path from "node:path";
import { parseArgs } from "node:util";
import { networkSiteCodes } from "@/lib/feed/network";
import { FeedGenerator, scenarios, type Scenario } from "./generator";
import { loadEnvFile, parseRate } from "./config";
import { sendWithRetry, sleep } from "./poster";

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
    },
  });
  const scenario = values.scenario as Scenario;
  if (!scenarios.includes(scenario)) throw new Error(`--scenario must be one of ${scenarios.join(", ")}`);
  const intervalMs = parseRate(values.rate ?? "2/min");
  const count = values.count === undefined ? Number.POSITIVE_INFINITY : Number(values.count);
  if (!(count >= 0)) throw new Error("--count must be a number");
  const seed = values.seed ?? String(Date.now());
  const baseUrl = values.url ?? process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://localhost:3000";
  const secret = process.env.FEED_SIGNING_SECRET;
  if (!secret) throw new Error("FEED_SIGNING_SECRET is not set (environment or .env.local)");

  const generator = new FeedGenerator({ seed, scenario, sites: networkSiteCodes(), trackSamples: Number(values.samples) });
  const stop = new AbortController();
  process.once("SIGINT", () => stop.abort());
  process.once("SIGTERM", () => stop.abort());
  console.log(`[feed] ${scenario} at ${values.rate} to ${baseUrl}, seed ${seed}${Number.isFinite(count) ? `, ${count} posts` : ""}`);

  let sent = 0;
  while (sent < count && !stop.signal.aborted) {
    const post = generator.next(Date.now());
    const outcome = await sendWithRetry(baseUrl, post, secret, { signal: stop.signal, log: (line) => console.log(line) });
    if (!outcome) break;
    sent += 1;
    const body = outcome.body as { id?: string; outcome?: string; error?: string } | string;
    const detail = typeof body === "string" ? body.slice(0, 120) : body.error ?? `${body.outcome ?? ""} ${body.id ?? ""}`;
    const expected = post.expectedStatuses.includes(outcome.status) ? "" : ` (expected ${post.expectedStatuses.join("/")})`;
    console.log(`[feed] ${outcome.status}${expected} ${post.description}: ${detail.trim()} (${outcome.elapsedMs.toFixed(0)} ms)`);
    // Another pipeline's report of the same signal follows within seconds, not at the feed's rate.
    if (sent < count) await sleep(generator.peekCompanion() ? Math.min(intervalMs, 1_500) : intervalMs, stop.signal);
  }
  console.log(`[feed] stopped after ${sent} posts`);
}

main().catch((error: unknown) => {
  console.error(`[feed] ${(error as Error).message}`);
  process.exit(1);
});
