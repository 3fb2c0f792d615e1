/**
 * The derived-physics JSON stored with each trigger revision and answered by the feed API. Plain data only
 * (no NaN/Infinity): anything that cannot be computed is null with a one-line reason in the matching *Error field.
 */
import type { ClassProbabilities } from "./source-class";
import type { MergerFrequencies } from "./merger-frequencies";

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
  trackKind: "time" | "derivative";
  /** RMS residual in residualRmsUnit: Hz for f(t) tracks, a dimensionless fraction of df/dt for (f, df/dt) pairs. */
  residualRms: number | null;
  residualRmsUnit: "Hz" | "fraction";
  samplesUsed: number;
  reducedChiSquare: number | null;
  uncertaintyScale: number;
  weighting: string;
  frequencyMinHz: number;
  frequencyMaxHz: number;
  warnings: string[];
}

export type FitPlot =
  | {
      kind: "frequency-vs-time";
      curve: { tS: number[]; frequencyHz: number[] };
      samples: { tS: number[]; frequencyHz: number[]; residualHz: (number | null)[] };
    }
  | {
      kind: "derivative-vs-frequency";
      curve: { frequencyHz: number[]; dfdtHzPerS: number[] };
      samples: { frequencyHz: number[]; dfdtHzPerS: number[]; residualFraction: number[] };
    };

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
  settingsUsed: { nsMaxMassSolar: number; gapUpperMassSolar: number; nsRadiusKm: number; sampleCount: number };
}
