import { chirpMassFromComponents } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";
import type { FakeSource } from "./population";
import { round, type FeedRandom } from "./random";
import { makeTrack } from "./track";

export interface PayloadPlan {
  source: string;
  externalId: string;
  revision: number;
  stage: FeedCandidate["stage"];
  /** the feed's merger-time estimate, Unix ms */
  eventTimeMs: number;
  /** later revisions measure better: the reported mass spread shrinks by this factor */
  precision: number;
  trackSamples: number;
  /** early warnings: the last track sample, seconds relative to eventTime */
  lastSampleTimeS?: number;
}

const relativeMassSd = { bns: 0.06, nsbh: 0.15, bbh: 0.2 } as const;

/** A noisy report of a source, as a pipeline would post it. */
export function buildPayload(rng: FeedRandom, truth: FakeSource, plan: PayloadPlan): FeedCandidate {
  const zFactor = 1 + truth.redshift;
  const m1Det = truth.mass1SourceFrame * zFactor;
  const m2Det = truth.mass2SourceFrame * zFactor;
  const relSd = relativeMassSd[truth.sourceClass] * plan.precision;
  const reported = (massDet: number) => {
    const mean = Math.max(0.5, massDet * (1 + rng.normal(0, relSd / 2)));
    return { mean: round(mean, 3), sd: round(mean * relSd, 3) };
  };
  const track = makeTrack(rng, {
    chirpMassDetectorFrame: chirpMassFromComponents(m1Det, m2Det),
    totalMassDetectorFrame: m1Det + m2Det,
    coalescenceTimeS: rng.normal(0, 0.002),
    sampleCount: plan.trackSamples,
    noiseFraction: 0.01,
    lastSampleTimeS: plan.lastSampleTimeS,
  });
  const payload: FeedCandidate = {
    source: plan.source,
    externalId: plan.externalId,
    revision: plan.revision,
    stage: plan.stage,
    eventTime: new Date(Math.round(plan.eventTimeMs)).toISOString(),
    detectors: truth.detectors,
    networkSnr: round(truth.networkSnr * (1 + rng.normal(0, 0.03 * plan.precision)), 2),
    falseAlarmRatePerYear: Number((truth.falseAlarmRatePerYear * 10 ** rng.normal(0, 0.2 * plan.precision)).toPrecision(3)),
    frequencyTrack: track,
    masses: { m1: reported(m1Det), m2: reported(m2Det) },
  };
  if (truth.sourceClass !== "bns" || rng.chance(0.5)) {
    payload.spins = { chi1: round(truth.spin1, 3), chi2: round(truth.spin2, 3) };
  }
  if (rng.chance(0.9)) {
    const mean = Math.max(5, truth.distanceMpc * (1 + rng.normal(0, 0.15 * plan.precision)));
    payload.distanceMpc = { mean: round(mean, 1), sd: round(mean * 0.3 * plan.precision, 1) };
  }
  return payload;
}
