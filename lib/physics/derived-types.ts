/**
 * The derived-physics JSON stored with each trigger revision and answered by the feed API. Plain data only
 * (no NaN/Infinity): anything that cannot be computed is null with a one-line reason in the matching *Error field.
 */
import type { ShapeCheck } from "./chirp-shape";
import type { AstroProbability } from "./p-astro";
import type { ClassProbabilities } from "./source-class";
import type { MergerFrequencies } from "./merger-frequencies";
import type { RemnantMatterEstimate } from "./remnant-matter";
import type { PhysicsSettings } from "./index";

export interface ValueWithSd {
  value: number;
  sd: number;
}

export interface ChirpMassBlock {
  detectorFrame: ValueWithSd;
  /** detector frame / (1 + z); with an assumed z = 0 it equals the detector frame (see redshiftAssumed). */
  sourceFrame: ValueWithSd | null;
  sourceFrameError: string | null;
}

export interface FitDiagnostics {
  /** always "time": the feed sends f(t) samples (kept so stored results and API clients read the same shape) */
  trackKind: "time";
  /** the frequency evolution fitted: 3.5PN TaylorT4 with the trigger's mass ratio, or leading order */
  model: "pn-3.5" | "leading-order";
  /** RMS residual of the frequency samples about the fitted chirp, in residualRmsUnit (Hz). */
  residualRms: number | null;
  residualRmsUnit: "Hz";
  samplesUsed: number;
  reducedChiSquare: number | null;
  uncertaintyScale: number;
  weighting: string;
  frequencyMinHz: number;
  frequencyMaxHz: number;
  /** η used by the PN fit, its sd from the trigger's masses, and the part of the chirp-mass sd it causes (M☉) */
  massRatio: { eta: number; etaSd: number; chirpMassSdFromMassRatio: number } | null;
  /** chirp-shape criteria (time tracks); a failed check leaves chirpMass null */
  shapeCheck: ShapeCheck | null;
  warnings: string[];
}

export interface FitPlot {
  kind: "frequency-vs-time";
  curve: { tS: number[]; frequencyHz: number[] };
  samples: { tS: number[]; frequencyHz: number[]; residualHz: (number | null)[] };
}

export interface Derived {
  chirpMass: ChirpMassBlock | null;
  chirpMassError: string | null;
  /** Seconds relative to eventTime (same origin as the track times). */
  coalescenceTime: number | null;
  coalescenceTimeSd: number | null;
  coalescenceTimeError: string | null;
  /** coalescenceTime − secondsSinceEventTimeAtReceipt; negative means merged before receipt. */
  secondsToMerger: number | null;
  secondsToMergerError: string | null;
  classProbabilities: ClassProbabilities | null;
  classProbabilitiesError: string | null;
  classSampleCount: number;
  /** binomial Monte Carlo standard error of each class probability, √(p (1 − p) / N) */
  classProbabilitiesSe: ClassProbabilities | null;
  astroProbability: AstroProbability | null;
  astroProbabilityError: string | null;
  remnantMatter: RemnantMatterEstimate | null;
  remnantMatterError: string | null;
  pNeutronStar: number | null;
  pNeutronStarError: string | null;
  pRemnantMatter: number | null;
  pRemnantMatterError: string | null;
  mergerFrequency: MergerFrequencies | null;
  mergerFrequencyError: string | null;
  redshift: ValueWithSd | null;
  redshiftAssumed: boolean;
  redshiftError: string | null;
  fit: FitDiagnostics | null;
  fitError: string | null;
  plot: FitPlot | null;
  plotError: string | null;
  settingsUsed: PhysicsSettings;
}
