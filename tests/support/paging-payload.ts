import { chirpFrequencyAt, chirpMassFromComponents } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";

/**
 * A small feed payload for a fictional candidate on the fictional N1/S1 network; the track follows the
 * leading-order chirp (Peters & Mathews 1963, via lib/physics) so the ingest's physics has a real track to fit.
 */
export function pagingPayload(externalId: string, eventTime: Date, overrides: Partial<FeedCandidate> = {}): FeedCandidate {
  const chirpMass = chirpMassFromComponents(1.4, 1.3);
  const t: number[] = [];
  const f: number[] = [];
  for (let i = 0; i < 32; i++) {
    const ti = -6 + (i * 5.95) / 31;
    t.push(Number(ti.toFixed(4)));
    f.push(Number(chirpFrequencyAt(chirpMass, 0, ti).toFixed(3)));
  }
  return {
    source: "paging-test",
    externalId,
    revision: 1,
    stage: "first-look",
    eventTime: eventTime.toISOString(),
    detectors: ["N1", "S1"],
    networkSnr: 14.2,
    falseAlarmRatePerYear: 0.02,
    frequencyTrack: { t, f },
    masses: { m1: { mean: 1.4, sd: 0.1 }, m2: { mean: 1.3, sd: 0.1 } },
    ...overrides,
  };
}
