import type { FakeSource } from "./population";
import { round, type FeedRandom } from "./random";

/**
 * One signal, several pipelines: the search pipelines of our invented network analyse the same data, so a signal
 * arrives as one to three triggers from different pipelines, each with its own merger-time estimate (within
 * ±0.3 s of the first's) and, through buildPayload's per-report noise, slightly different masses, SNR and rates.
 */
export function companionPlan(rng: FeedRandom, pipelines: readonly string[], leadSource: string): Array<{ source: string; offsetMs: number }> {
  const others = pipelines.filter((p) => p !== leadSource);
  const roll = rng.next();
  const count = roll < 0.5 ? 0 : roll < 0.8 ? 1 : 2;
  const chosen: string[] = [];
  for (let i = 0; i < Math.min(count, others.length); i++) {
    const left = others.filter((p) => !chosen.includes(p));
    chosen.push(rng.pick(left));
  }
  return chosen.map((source) => ({ source, offsetMs: round(rng.uniform(-300, 300), 1) }));
}

/**
 * A noise trigger: one pipeline, near threshold, with a high false-alarm rate (10–1000 per year), that no other
 * pipeline confirms. The masses are drawn like a light black-hole pair's; the point is the rate and the loneliness.
 */
export function noiseSource(source: FakeSource, rng: FeedRandom): FakeSource {
  return {
    ...source,
    networkSnr: round(rng.uniform(8, 9.5), 2),
    falseAlarmRatePerYear: Number((10 ** rng.uniform(1, 3)).toPrecision(3)),
    detectors: source.detectors.slice(0, 2),
  };
}
