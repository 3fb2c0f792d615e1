/**
 * Weighted least-squares fit of the leading-order chirp to a frequency track f(t), Peters & Mathews 1963
 * (Phys. Rev. 131, 435): f^(−8/3) = (256/5) π^(8/3) (G𝓜/c³)^(5/3) (t_c − t).
 * A closed-form straight line in y = f^(−8/3) gives the start; Gauss–Newton on the frequencies themselves gives the
 * answer, because weights and the power law applied to noisy f bias the straight line at the level of its own error
 * bar. Long tracks start from a ≤ 2048-sample subsample, so the full data are passed over only two or three times.
 * Times in s (relative to eventTime), frequencies in Hz, chirp mass in the detector frame.
 */
import { CHIRP_TIME_COEFFICIENT, chirpMassFromLogAmplitude } from "./chirp";
import { evaluate, gaussNewton, inverseNormalOf, leadingOrderEvaluator, straightLineStart, type Samples } from "./chirp-fit-model";
import { fail, succeed, type PhysicsResult } from "./result";
import { validateTimeTrack, type TimeTrackInput } from "./time-track-validation";

export type { TimeTrackInput } from "./time-track-validation";

export interface TimeTrackFit {
  trackKind: "time";
  chirpMassDetectorFrame: number;
  chirpMassDetectorFrameSd: number;
  coalescenceTimeS: number;
  coalescenceTimeSd: number;
  /** Unweighted RMS of f_observed − f_model (Hz). */
  residualRmsHz: number;
  /** χ²/dof in units of the given σ; null when no per-sample σ was given (weights are then only relative). */
  reducedChiSquare: number | null;
  /** With per-sample σ: PDG scale factor √max(1, χ²/dof) applied to the errors; without: the RMS scatter in Hz. */
  uncertaintyScale: number;
  weighting: "per-sample-sigma" | "equal-frequency-uncertainty";
  samplesUsed: number;
  /** Gauss–Newton iterations over the full track. */
  iterations: number;
  /** Model f(t) = referenceFrequencyHz · (amplitudePerS · (t_c − t))^(−3/8), for plotting. */
  model: { referenceFrequencyHz: number; amplitudePerS: number };
}

const SUBSAMPLE_LIMIT = 2048;
/** Largest full-track Gauss–Newton step (in standard errors) applied without a further pass; see fitTimeTrack. */
export const FULL_TRACK_STEP_TOLERANCE = 0.5;

export function subsample(samples: Samples): Samples {
  const n = samples.t.length;
  if (n <= SUBSAMPLE_LIMIT) return samples;
  // One plain loop over precomputed indices (Array.from with a callback was a measurable share of a 10⁵ fit).
  const index = new Int32Array(SUBSAMPLE_LIMIT);
  for (let k = 0; k < SUBSAMPLE_LIMIT; k++) index[k] = Math.round((k * (n - 1)) / (SUBSAMPLE_LIMIT - 1));
  // Built by push, so the subsample keeps the input's element kind (packed doubles for a typical track): a
  // preallocated `new Array(n)` is holey, and the fit loops then see two array kinds and are compiled slower.
  const pick = (values: readonly number[]) => {
    const out: number[] = [];
    for (let k = 0; k < SUBSAMPLE_LIMIT; k++) out.push(values[index[k] as number] as number);
    return out;
  };
  return { t: pick(samples.t), f: pick(samples.f), sigma: samples.sigma === undefined ? undefined : pick(samples.sigma) };
}

/** Detector-frame chirp mass (M☉) and t_c (s) with 1σ errors from f(t) samples (Hz, s), Peters & Mathews 1963. */
export function fitTimeTrack(track: TimeTrackInput): PhysicsResult<TimeTrackFit> {
  const checked = validateTimeTrack(track);
  if (!checked.ok) return checked;
  const samples: Samples = { t: track.t, f: track.f, sigma: track.fSigma };
  const n = samples.t.length;
  const fRef = checked.value.maxFrequencyHz;
  const coarse = subsample(samples);
  const start = straightLineStart(coarse, fRef);
  if (!start.ok) return start;
  const coarseFit = coarse === samples ? null : gaussNewton(coarse, leadingOrderEvaluator(coarse, fRef), start.value, 1e-4);
  if (coarseFit !== null && !coarseFit.ok) return coarseFit;
  // Within a standard error of the minimum, Gauss–Newton converges quadratically here: a step of s standard errors
  // leaves about 10⁻³ s² behind (measured over 10³–10⁵-sample tracks; tested below 10⁻³ for s = 0.5). So a
  // full-track step below half a standard error is applied without another pass over the data.
  const withSigma = samples.sigma !== undefined;
  const refined = gaussNewton(
    samples,
    leadingOrderEvaluator(samples, fRef),
    coarseFit?.value.point ?? start.value,
    coarse === samples ? 1e-4 : FULL_TRACK_STEP_TOLERANCE,
    !withSigma && coarse !== samples,
  );
  if (!refined.ok) return refined;
  const { logA, tc } = refined.value.point;
  const current = refined.value.evaluation;
  // A singular N fails below (after the checks that come first); NaNs carry it there.
  const inverse = inverseNormalOf(current);
  const inverseNormal = inverse ?? ([Number.NaN, Number.NaN, Number.NaN] as const);
  // The sandwich errors need the leverages, from N⁻¹. A long track's last pass already summed them with the N⁻¹
  // of the pass before (its leverages are ~2/n, and N moved by well under 1 %); otherwise one more pass.
  const final = withSigma || current.withSandwich ? current : evaluate(samples, fRef, refined.value.point, inverseNormal);
  if (final === null) return fail("degenerate-fit", "refined coalescence time falls inside the track");
  const reducedChiSquare = final.chiSquare / (n - 2);
  let uncertaintyScale: number;
  let logASd: number;
  let coalescenceTimeSd: number;
  if (withSigma) {
    // Given σ: formal covariance N⁻¹, inflated by the PDG scale factor (Review of Particle Physics, §5.2.2).
    uncertaintyScale = Math.sqrt(Math.max(1, reducedChiSquare));
    logASd = uncertaintyScale * Math.sqrt(inverseNormal[0]);
    coalescenceTimeSd = uncertaintyScale * Math.sqrt(inverseNormal[2]);
  } else {
    // No σ: heteroscedasticity-consistent sandwich N⁻¹ M N⁻¹ (White 1980) with leverage-corrected residuals
    // (HC3, MacKinnon & White 1985), honest whether the scatter is constant in Hz or grows with frequency.
    const [iaa, iat, itt] = inverseNormal;
    uncertaintyScale = Math.sqrt(reducedChiSquare);
    logASd = Math.sqrt(iaa * iaa * final.maa + 2 * iaa * iat * final.mat + iat * iat * final.mtt);
    coalescenceTimeSd = Math.sqrt(iat * iat * final.maa + 2 * iat * itt * final.mat + itt * itt * final.mtt);
  }
  // A = −slope of f^(−8/3) in units of fRef^(−8/3): (G𝓜/c³)^(5/3) = A fRef^(−8/3) / ((256/5) π^(8/3)).
  const chirpMassDetectorFrame = chirpMassFromLogAmplitude(logA - (8 / 3) * Math.log(fRef) - Math.log(CHIRP_TIME_COEFFICIENT));
  if (!Number.isFinite(chirpMassDetectorFrame) || !(chirpMassDetectorFrame > 0) || inverse === null) {
    return fail("non-physical-slope", "fit gives no finite positive chirp mass");
  }
  return succeed({
    trackKind: "time",
    chirpMassDetectorFrame,
    chirpMassDetectorFrameSd: chirpMassDetectorFrame * (3 / 5) * logASd,
    coalescenceTimeS: tc,
    coalescenceTimeSd,
    residualRmsHz: Math.sqrt(final.residualSumSq / n),
    reducedChiSquare: withSigma ? reducedChiSquare : null,
    uncertaintyScale,
    weighting: withSigma ? "per-sample-sigma" : "equal-frequency-uncertainty",
    samplesUsed: n,
    iterations: refined.value.iterations,
    model: { referenceFrequencyHz: fRef, amplitudePerS: Math.exp(logA) },
  });
}
