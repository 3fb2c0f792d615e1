import type { Stage } from "@/db/schema";
import { chirpMassFromComponents, pnChirpFrequencyAt } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";

export interface PayloadOptions {
  externalId: string;
  revision?: number;
  stage?: Stage;
  eventTime?: Date;
  mass1?: number;
  mass2?: number;
  falseAlarmRatePerYear?: number;
  networkSnr?: number;
  /** seconds of track before eventTime (the track ends 0.05 s before it) */
  trackSeconds?: number;
}

/**
 * A feed payload for a fictional candidate whose track follows the 3.5PN TaylorT4 chirp of its masses exactly
 * (Peters & Mathews 1963, through lib/physics), so the fit has something real to find.
 */
export function candidatePayload(o: PayloadOptions): FeedCandidate {
  const mass1 = o.mass1 ?? 1.5;
  const mass2 = o.mass2 ?? 1.3;
  const chirpMass = chirpMassFromComponents(mass1, mass2);
  const span = o.trackSeconds ?? 8;
  const t: number[] = [];
  const f: number[] = [];
  for (let i = 0; i < 64; i++) {
    const ti = -span + (i * (span - 0.05)) / 63;
    t.push(Number(ti.toFixed(4)));
    f.push(Number(pnChirpFrequencyAt(chirpMass, (mass1 * mass2) / (mass1 + mass2) ** 2, 0, ti).toFixed(3)));
  }
  return {
    source: "test-pipe",
    externalId: o.externalId,
    revision: o.revision ?? 1,
    stage: o.stage ?? "first-look",
    eventTime: (o.eventTime ?? new Date()).toISOString(),
    detectors: ["N1", "S1"],
    networkSnr: o.networkSnr ?? 12.5,
    falseAlarmRatePerYear: o.falseAlarmRatePerYear ?? 0.01,
    frequencyTrack: { t, f },
    masses: { m1: { mean: mass1, sd: 0.1 }, m2: { mean: mass2, sd: 0.1 } },
    distanceMpc: { mean: 120, sd: 30 },
  };
}
