/**
 * Weighted least-squares fit of the leading-order chirp to a frequency track f(t), Peters & Mathews 1963
 * (Phys. Rev. 131, 435): f^(−8/3) = (256/5) π^(8/3) (G𝓜/c³)^(5/3) (t_c − t).
 * Step 1 fits that straight line in y = f^(−8/3) (closed form, the starting point); step 2 refines by Gauss–Newton
 * on the frequencies themselves, f(t) = fRef (A (t_c − t))^(−3/8), because weights and the power law applied to
 * noisy f bias the straight-line fit at the level of its own error bar (Press et al., Numerical Recipes §15.5).
 * Times in s (relative to eventTime), frequencies in Hz, chirp mass in the detector frame.
 */
import { CHIRP_TIME_COEFFICIENT, chirpMassFromLogAmplitude } from "./chirp";
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
  /** Always 0 after the refinement (the model needs t < t_c); kept for the diagnostics shape. */
  samplesAfterCoalescence: number;
  iterations: number;
  /** Model f(t) = referenceFrequencyHz · (amplitudePerS · (t_c − t))^(−3/8), for plotting. */
  model: { referenceFrequencyHz: number; amplitudePerS: number };
}

const MAX_ITERATIONS = 30;
const MAX_HALVINGS = 40;

/** x^(−3/8) from square roots only (x^(1/4) · x^(1/8) = x^(3/8)); several times faster than Math.pow. */
function inverseThreeEighths(x: number): number {
  const quarter = Math.sqrt(Math.sqrt(x));
  return 1 / (quarter * Math.sqrt(quarter));
}

interface Evaluation {
  chiSquare: number;
  // Normal matrix (symmetric 2×2) and gradient for parameters (ln A, t_c).
  naa: number;
  nat: number;
  ntt: number;
  ga: number;
  gt: number;
  residualSumSq: number;
  // Σ r² J Jᵀ, the "meat" of the heteroscedasticity-consistent covariance (White 1980).
  maa: number;
  mat: number;
  mtt: number;
}

/**
 * χ², normal matrix and gradient of the f-space model at (ln A, t_c); null if any sample lies at/after t_c.
 * With `inverseNormal`, also the leverage-corrected sandwich sums. Local accumulators keep the loop allocation-free.
 */
function evaluate(
  t: readonly number[],
  f: readonly number[],
  sigma: readonly number[] | undefined,
  fRef: number,
  logA: number,
  tc: number,
  inverseNormal: readonly [number, number, number] | null = null,
): Evaluation | null {
  const scale = fRef * Math.exp(-0.375 * logA);
  const withLeverage = inverseNormal !== null;
  const iaa = inverseNormal?.[0] ?? 0;
  const iat = inverseNormal?.[1] ?? 0;
  const itt = inverseNormal?.[2] ?? 0;
  let chiSquare = 0;
  let residualSumSq = 0;
  let naa = 0;
  let nat = 0;
  let ntt = 0;
  let ga = 0;
  let gt = 0;
  let maa = 0;
  let mat = 0;
  let mtt = 0;
  const n = t.length;
  for (let i = 0; i < n; i++) {
    const remaining = tc - (t[i] as number);
    if (!(remaining > 0)) return null;
    const model = scale * inverseThreeEighths(remaining);
    const r = (f[i] as number) - model;
    const s = sigma === undefined ? 1 : (sigma[i] as number);
    const wi = 1 / (s * s);
    const ja = -0.375 * model;
    const jt = ja / remaining;
    chiSquare += wi * r * r;
    residualSumSq += r * r;
    naa += wi * ja * ja;
    nat += wi * ja * jt;
    ntt += wi * jt * jt;
    ga += wi * ja * r;
    gt += wi * jt * r;
    if (withLeverage) {
      // Leverage h = w Jᵀ N⁻¹ J; r²/(1 − h)² is the jackknife-like "HC3" weighting (MacKinnon & White 1985).
      const leverage = Math.min(wi * (ja * ja * iaa + 2 * ja * jt * iat + jt * jt * itt), 1 - 1e-12);
      const r2 = (r * r) / ((1 - leverage) * (1 - leverage));
      maa += r2 * ja * ja;
      mat += r2 * ja * jt;
      mtt += r2 * jt * jt;
    }
  }
  return { chiSquare, naa, nat, ntt, ga, gt, residualSumSq, maa, mat, mtt };
}

/** Closed-form weighted straight line in y = (f/fRef)^(−8/3): returns (ln A, t_c) or a failure. */
function straightLineStart(track: TimeTrackInput, fRef: number): PhysicsResult<{ logA: number; tc: number }> {
  const { t, f, fSigma } = track;
  const n = f.length;
  let sumW = 0;
  let sumWt = 0;
  let sumWy = 0;
  let sumWtt = 0;
  let sumWty = 0;
  const t0 = t[0] as number;
  for (let i = 0; i < n; i++) {
    const fi = f[i] as number;
    const g = fi / fRef;
    const cube = Math.cbrt(g);
    const g83 = g * g * cube * cube;
    const y = 1 / g83;
    // σ_y = (8/3) y σ_f / f; without σ_f every sample shares one σ_f, so w ∝ (f/y)² = g^(22/3).
    let wi: number;
    if (fSigma === undefined) {
      const g113 = g * g83;
      wi = g113 * g113;
    } else {
      const sigmaY = ((8 / 3) * y * (fSigma[i] as number)) / fi;
      wi = 1 / (sigmaY * sigmaY);
    }
    const ti = (t[i] as number) - t0;
    sumW += wi;
    sumWt += wi * ti;
    sumWy += wi * y;
    sumWtt += wi * ti * ti;
    sumWty += wi * ti * y;
  }
  const stt = sumWtt - (sumWt * sumWt) / sumW;
  const slope = (sumWty - (sumWt * sumWy) / sumW) / stt;
  if (!Number.isFinite(slope) || !(stt > 0)) return fail("degenerate-fit", "weighted samples have no spread in time");
  if (!(slope < 0)) return fail("non-physical-slope", "f^(−8/3) does not fall with time (slope ≥ 0)");
  const tc = t0 + sumWt / sumW - sumWy / sumW / slope;
  return succeed({ logA: Math.log(-slope), tc });
}

export function fitTimeTrack(track: TimeTrackInput): PhysicsResult<TimeTrackFit> {
  const checked = validateTimeTrack(track);
  if (!checked.ok) return checked;
  const { t, f, fSigma } = track;
  const n = f.length;
  const fRef = checked.value.maxFrequencyHz;
  const start = straightLineStart(track, fRef);
  if (!start.ok) return start;

  const w = fSigma;
  const tLast = t[n - 1] as number;
  const span = tLast - (t[0] as number);
  let logA = start.value.logA;
  // The f-space model needs every sample before t_c; nudge a noisy start past the last sample.
  let tc = Math.max(start.value.tc, tLast + (1e-3 * span) / n);
  let current = evaluate(t, f, w, fRef, logA, tc);
  let iterations = 0;
  while (current !== null && iterations < MAX_ITERATIONS) {
    const det = current.naa * current.ntt - current.nat * current.nat;
    if (!(det > 0)) break;
    const stepA = (current.ntt * current.ga - current.nat * current.gt) / det;
    const stepT = (current.naa * current.gt - current.nat * current.ga) / det;
    // Stop once the step is below 10⁻⁴ of the parameter's own standard error (or at rounding level).
    const variance = Math.max(current.chiSquare / (n - 2), Number.MIN_VALUE);
    const tiny =
      (stepA * stepA * det) / (current.ntt * variance) < 1e-8 && (stepT * stepT * det) / (current.naa * variance) < 1e-8;
    if (tiny || (Math.abs(stepA) < 1e-14 && Math.abs(stepT) <= 1e-14 * Math.max(1, Math.abs(tc)))) break;
    iterations++;
    let factor = 1;
    let accepted: { logA: number; tc: number; e: Evaluation } | null = null;
    for (let h = 0; h < MAX_HALVINGS && accepted === null; h++, factor /= 2) {
      const trialA = logA + factor * stepA;
      const trialT = tc + factor * stepT;
      const e = evaluate(t, f, w, fRef, trialA, trialT);
      if (e !== null && e.chiSquare <= current.chiSquare) accepted = { logA: trialA, tc: trialT, e };
    }
    if (accepted === null) break;
    logA = accepted.logA;
    tc = accepted.tc;
    current = accepted.e;
  }
  if (current === null) return fail("degenerate-fit", "refined coalescence time falls inside the track");
  const det = current.naa * current.ntt - current.nat * current.nat;
  if (!(det > 0)) return fail("degenerate-fit", "singular normal matrix");
  const inverseNormal = [current.ntt / det, -current.nat / det, current.naa / det] as const;
  // The sandwich errors need one more pass with the final N⁻¹ (for the leverages).
  const final = w === undefined ? evaluate(t, f, w, fRef, logA, tc, inverseNormal) : current;
  if (final === null) return fail("degenerate-fit", "refined coalescence time falls inside the track");
  const reducedChiSquare = final.chiSquare / (n - 2);
  let uncertaintyScale: number;
  let logASd: number;
  let coalescenceTimeSd: number;
  if (w !== undefined) {
    // Given σ: formal covariance N⁻¹, inflated by the PDG scale factor when the scatter exceeds the σ.
    uncertaintyScale = Math.sqrt(Math.max(1, reducedChiSquare));
    logASd = uncertaintyScale * Math.sqrt(final.ntt / det);
    coalescenceTimeSd = uncertaintyScale * Math.sqrt(final.naa / det);
  } else {
    // No σ: heteroscedasticity-consistent sandwich N⁻¹ M N⁻¹ (White 1980) with leverage-corrected residuals
    // (HC3, MacKinnon & White 1985), honest whether the scatter is constant in Hz or grows with frequency.
    const [iaa, iat, itt] = inverseNormal;
    const varA = iaa * iaa * final.maa + 2 * iaa * iat * final.mat + iat * iat * final.mtt;
    const varT = iat * iat * final.maa + 2 * iat * itt * final.mat + itt * itt * final.mtt;
    uncertaintyScale = Math.sqrt(reducedChiSquare);
    logASd = Math.sqrt(varA);
    coalescenceTimeSd = Math.sqrt(varT);
  }
  // A = −slope of f^(−8/3) in units of fRef^(−8/3): (G𝓜/c³)^(5/3) = A fRef^(−8/3) / ((256/5) π^(8/3)).
  const chirpMassDetectorFrame = chirpMassFromLogAmplitude(logA - (8 / 3) * Math.log(fRef) - Math.log(CHIRP_TIME_COEFFICIENT));
  if (!Number.isFinite(chirpMassDetectorFrame) || !(chirpMassDetectorFrame > 0)) {
    return fail("non-physical-slope", "fit gives no finite positive chirp mass");
  }
  return succeed({
    trackKind: "time",
    chirpMassDetectorFrame,
    chirpMassDetectorFrameSd: chirpMassDetectorFrame * (3 / 5) * logASd,
    coalescenceTimeS: tc,
    coalescenceTimeSd,
    residualRmsHz: Math.sqrt(final.residualSumSq / n),
    reducedChiSquare: w === undefined ? null : reducedChiSquare,
    uncertaintyScale,
    weighting: w === undefined ? "equal-frequency-uncertainty" : "per-sample-sigma",
    samplesUsed: n,
    samplesAfterCoalescence: 0,
    iterations,
    model: { referenceFrequencyHz: fRef, amplitudePerS: Math.exp(logA) },
  });
}
