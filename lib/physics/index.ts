/**
 * Signal physics for Chirpdesk: chirp-mass fit, source-class probabilities, merger frequencies, Planck 2018
 * distances. Pure TypeScript, no framework imports, no I/O. Masses in M☉ with the frame in every name,
 * frequencies in Hz, times in s.
 */
import { computeDerivedPhysics } from "./compute-derived";
import type { Derived } from "./derived-types";

export type ChirpModel = "pn-3.5" | "leading-order";

export interface PhysicsSettings {
  nsMaxMassSolar: number;
  gapUpperMassSolar: number;
  nsRadiusKm: number;
  sampleCount: number;
  /** which frequency evolution the chirp fit uses (pn-3.5 needs the trigger's masses; falls back otherwise) */
  chirpModel: ChirpModel;
  /** expected astrophysical triggers per year above pAstroSnrThreshold */
  pAstroRatePerYear: number;
  pAstroSnrThreshold: number;
}

/**
 * 3 and 5 M☉ class boundaries and a 12 km neutron-star radius are common practice; 20 000 Monte Carlo samples.
 * p_astro: an SNR threshold of 8 is the usual detection threshold (common practice); 50 astrophysical triggers per
 * year above it is the order of a current-generation network's detection rate (from memory) — set both for the
 * network in Settings → Physics.
 */
export const defaultPhysicsSettings: PhysicsSettings = {
  nsMaxMassSolar: 3.0,
  gapUpperMassSolar: 5.0,
  nsRadiusKm: 12,
  sampleCount: 20_000,
  chirpModel: "pn-3.5",
  pAstroRatePerYear: 50,
  pAstroSnrThreshold: 8,
};

export interface TriggerPhysicsInput {
  /** f(t) samples: t in s relative to eventTime, f in Hz, optional 1σ fSigma in Hz (lib/validations/feed.ts). */
  frequencyTrack: { t: number[]; f: number[]; fSigma?: number[] };
  /** Component masses, detector frame, solar masses. */
  masses: { m1: { mean: number; sd: number }; m2: { mean: number; sd: number } };
  /** Dimensionless spins aligned with the orbital angular momentum, in [−1, 1]. */
  spins?: { chi1: number; chi2: number };
  distanceMpc?: { mean: number; sd: number };
  /** Receipt time minus eventTime in seconds (negative for an early warning). */
  secondsSinceEventTimeAtReceipt: number;
  /** The trigger's network SNR and false-alarm rate (per year), for the probability of astrophysical origin. */
  networkSnr?: number;
  falseAlarmRatePerYear?: number;
}

/**
 * Everything derived for one trigger revision. Never throws; `seed` (e.g. source/externalId/revision) fixes the
 * Monte Carlo so the same candidate always gets the same numbers.
 */
export function computeDerived(input: TriggerPhysicsInput, settings: PhysicsSettings, seed: string): Derived {
  return computeDerivedPhysics(input, settings, seed);
}

/** Seconds to merger at wall-clock time `nowMs` (client side): coalescenceTime + eventTime − now. */
export function secondsToMergerAt(coalescenceTimeS: number, eventTimeMs: number, nowMs: number): number {
  return coalescenceTimeS - (nowMs - eventTimeMs) / 1000;
}

export type { Derived, ChirpMassBlock, FitDiagnostics, FitPlot, ValueWithSd } from "./derived-types";
export type { ClassProbabilities } from "./source-class";
export type { AstroProbability } from "./p-astro";
export type { ShapeCheck, ShapeCriterion } from "./chirp-shape";
export type { MergerFrequencies, FramedMass } from "./merger-frequencies";
export type { PhysicsFailure, PhysicsFailureCode, PhysicsResult } from "./result";
export { chirpFrequencyAt, chirpMassFromComponents, timeToMergerSeconds } from "./chirp";
export { luminosityDistanceFromRedshift, redshiftFromLuminosityDistance } from "./distance-table";
export { iscoGravitationalWaveFrequencyHz, iscoRadius, schwarzschildIscoFrequencyHz } from "./kerr";
export { finalSpinAligned, radiatedEnergyFraction, ringdownMode } from "./remnant";
export { fitTimeTrack } from "./chirp-fit-time";
export { pnChirpFrequencyAt } from "./chirp-fit-pn-model";
export { computeSourceClasses } from "./source-class";
