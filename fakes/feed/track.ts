import { pnChirpFrequencyAt, schwarzschildIscoFrequencyHz, timeToMergerSeconds } from "@/lib/physics";
import { round, type FeedRandom } from "./random";

export interface TrackPlan {
  chirpMassDetectorFrame: number;
  totalMassDetectorFrame: number;
  /** coalescence time relative to the reported eventTime, s */
  coalescenceTimeS: number;
  sampleCount: number;
  /** fractional 1σ frequency noise, e.g. 0.01 */
  noiseFraction: number;
  /** for an early warning: the last sample time relative to eventTime (negative, before merger) */
  lastSampleTimeS?: number;
}

export interface FakeTrack {
  t: number[];
  f: number[];
  fSigma: number[];
}

/**
 * A frequency track from the 3.5PN TaylorT4 chirp (lib/physics/pn-taylor-t4.ts; start and end times from the
 * leading-order chirp time of Peters & Mathews 1963), sampled evenly in time between a low frequency and ~0.9 of the Schwarzschild ISCO
 * (or up to `lastSampleTimeS`), with Gaussian frequency noise of `noiseFraction`.
 */
export function makeTrack(rng: FeedRandom, plan: TrackPlan): FakeTrack {
  const mc = plan.chirpMassDetectorFrame;
  // η = (𝓜/M)^(5/3); the track follows the 3.5PN TaylorT4 evolution the desk fits (spins left out).
  const eta = Math.min(0.25, (mc / plan.totalMassDetectorFrame) ** (5 / 3));
  const tc = plan.coalescenceTimeS;
  const highHz = Math.min(500, 0.9 * schwarzschildIscoFrequencyHz(plan.totalMassDetectorFrame));
  const lowHz = Math.min(25, 0.3 * highHz);
  const start = tc - timeToMergerSeconds(mc, lowHz);
  let end = tc - timeToMergerSeconds(mc, highHz);
  if (plan.lastSampleTimeS !== undefined) end = Math.min(end, plan.lastSampleTimeS);
  // An early warning that arrives before the band opens still carries a short stretch of track.
  const first = Math.min(start, end - 4);
  const t: number[] = [];
  const f: number[] = [];
  const fSigma: number[] = [];
  const n = Math.max(3, plan.sampleCount);
  for (let i = 0; i < n; i++) {
    const time = first + ((end - first) * i) / (n - 1);
    const trueHz = pnChirpFrequencyAt(mc, eta, tc, time);
    t.push(round(time, 6));
    f.push(round(trueHz * (1 + rng.normal(0, plan.noiseFraction)), 4));
    fSigma.push(round(trueHz * plan.noiseFraction, 4));
  }
  return { t, f, fSigma };
}
