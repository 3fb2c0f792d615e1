/**
 * Chirp mass and coalescence time from f(t) with the 3.5PN TaylorT4 frequency evolution (pn-taylor-t4.ts), the
 * symmetric mass ratio and aligned spins taken from the trigger. Starts from the leading-order fit on a ≤ 2048
 * sample subsample, refines with the PN model there, then on the full track (Gauss–Newton, as chirp-fit-time.ts).
 *
 * Errors: the fit's own covariance (given σ: N⁻¹ with the PDG scale factor; no σ: the HC3 sandwich), plus the
 * mass-ratio uncertainty propagated to first order: σ_η from a seeded sample of the trigger's component masses,
 * ∂𝓜/∂η and ∂t_c/∂η by refitting the subsample at η ± δη; the parts are added in quadrature. Spins come as point
 * values from the feed and are not varied.
 */
import { chirpMassFromLogAmplitude, CHIRP_TIME_COEFFICIENT } from "./chirp";
import { gaussNewton, inverseNormalOf, leadingOrderEvaluator, straightLineStart, type ModelPoint, type Samples } from "./chirp-fit-model";
import { pnEvaluator, pnFrequencyAt } from "./chirp-fit-pn-model";
import { subsample, type TimeTrackFit } from "./chirp-fit-time";
import { buildPnTable, pnBinary, type PnTable } from "./pn-taylor-t4";
import { SeededRandom } from "./random";
import { fail, succeed, type PhysicsResult } from "./result";
import { validateTimeTrack, type TimeTrackInput } from "./time-track-validation";

export interface PnBinaryInput {
  mass1: { mean: number; sd: number };
  mass2: { mean: number; sd: number };
  chi1: number;
  chi2: number;
}

export interface PnTrackFit extends TimeTrackFit {
  eta: number;
  etaSd: number;
  /** part of chirpMassDetectorFrameSd that comes from σ_η (M☉); the rest is the fit's own */
  chirpMassSdFromMassRatio: number;
  /** f(t) of the fitted model, Hz (NaN at or after t_c) */
  frequencyAt: (tS: number) => number;
}

const ETA_SAMPLES = 256;

/** sd of η over seeded draws of the two masses (normal, truncated at 0); 0 when both sds are 0. */
export function massRatioSpread(input: PnBinaryInput, seed: string): number {
  if (input.mass1.sd === 0 && input.mass2.sd === 0) return 0;
  const random = new SeededRandom(`${seed}/eta`);
  let sum = 0;
  let sumSq = 0;
  let count = 0;
  for (let draws = 0; count < ETA_SAMPLES && draws < 64 * ETA_SAMPLES; draws++) {
    const m1 = input.mass1.mean + input.mass1.sd * random.normal();
    const m2 = input.mass2.mean + input.mass2.sd * random.normal();
    if (!(m1 > 0 && m2 > 0)) continue;
    const eta = (m1 * m2) / ((m1 + m2) * (m1 + m2));
    sum += eta;
    sumSq += eta * eta;
    count++;
  }
  if (count < 2) return 0;
  const mean = sum / count;
  return Math.sqrt(Math.max(0, (sumSq - count * mean * mean) / (count - 1)));
}

function tableFor(eta: number, input: PnBinaryInput): PnTable | null {
  const base = pnBinary(input.mass1.mean, input.mass2.mean, input.chi1, input.chi2);
  return buildPnTable({ ...base, eta });
}

/** Fits the subsample at another η from `start`; null if that fails. */
function refitAt(samples: Samples, eta: number, input: PnBinaryInput, start: ModelPoint): ModelPoint | null {
  const table = tableFor(eta, input);
  if (table === null) return null;
  const fit = gaussNewton(samples, pnEvaluator(samples, table), start, 1e-6);
  return fit.ok ? fit.value.point : null;
}

export function fitPnTrack(track: TimeTrackInput, input: PnBinaryInput, seed: string): PhysicsResult<PnTrackFit> {
  const checked = validateTimeTrack(track);
  if (!checked.ok) return checked;
  const { mass1, mass2 } = input;
  const eta = (mass1.mean * mass2.mean) / ((mass1.mean + mass2.mean) * (mass1.mean + mass2.mean));
  const table = tableFor(eta, input);
  if (table === null) return fail("degenerate-fit", "the PN energy–flux series turns non-positive below the ISCO for these masses and spins");
  const samples: Samples = { t: track.t, f: track.f, sigma: track.fSigma };
  const n = samples.t.length;
  const fRef = checked.value.maxFrequencyHz;
  const coarse = subsample(samples);
  const line = straightLineStart(coarse, fRef);
  if (!line.ok) return line;
  const leading = gaussNewton(coarse, leadingOrderEvaluator(coarse, fRef), line.value, 1e-4);
  if (!leading.ok) return leading;
  // Leading-order (ln A, t_c) → (ln 𝓜, t_c): (G𝓜/c³)^(5/3) = A fRef^(−8/3) / ((256/5) π^(8/3)).
  const logA = leading.value.point.logA;
  const start = { logA: Math.log(chirpMassFromLogAmplitude(logA - (8 / 3) * Math.log(fRef) - Math.log(CHIRP_TIME_COEFFICIENT))), tc: leading.value.point.tc };
  const coarsePn = gaussNewton(coarse, pnEvaluator(coarse, table), start, coarse === samples ? 1e-4 : 1e-3);
  if (!coarsePn.ok) return coarsePn;
  const withSigma = samples.sigma !== undefined;
  const evaluator = pnEvaluator(samples, table);
  const refined = coarse === samples ? coarsePn : gaussNewton(samples, evaluator, coarsePn.value.point, 0.5, !withSigma);
  if (!refined.ok) return refined;
  const point = refined.value.point;
  const current = refined.value.evaluation;
  const inverse = inverseNormalOf(current);
  if (inverse === null) return fail("degenerate-fit", "singular normal matrix");
  const final = withSigma || current.withSandwich ? current : evaluator(point, inverse);
  if (final === null) return fail("degenerate-fit", "refined coalescence time falls inside the track");
  const reducedChiSquare = final.chiSquare / (n - 2);
  const [iaa, iat, itt] = inverse;
  let uncertaintyScale: number;
  let logMSd: number;
  let tcSd: number;
  if (withSigma) {
    uncertaintyScale = Math.sqrt(Math.max(1, reducedChiSquare));
    logMSd = uncertaintyScale * Math.sqrt(iaa);
    tcSd = uncertaintyScale * Math.sqrt(itt);
  } else {
    uncertaintyScale = Math.sqrt(reducedChiSquare);
    logMSd = Math.sqrt(iaa * iaa * final.maa + 2 * iaa * iat * final.mat + iat * iat * final.mtt);
    tcSd = Math.sqrt(iat * iat * final.maa + 2 * iat * itt * final.mat + itt * itt * final.mtt);
  }
  const chirpMass = Math.exp(point.logA);
  // Mass-ratio part: central (one-sided at η = 1/4) difference of subsample refits.
  const etaSd = massRatioSpread(input, seed);
  let dLogM = 0;
  let dTc = 0;
  if (etaSd > 0) {
    const step = Math.min(Math.max(etaSd, 1e-4), 0.05);
    const low = Math.max(eta - step, 1e-4);
    const high = Math.min(eta + step, 0.25);
    const atLow = refitAt(coarse, low, input, point);
    const atHigh = refitAt(coarse, high, input, point);
    if (atLow !== null && atHigh !== null) {
      dLogM = (atHigh.logA - atLow.logA) / (high - low);
      dTc = (atHigh.tc - atLow.tc) / (high - low);
    }
  }
  const logMFromEta = Math.abs(dLogM) * etaSd;
  const totalLogMSd = Math.hypot(logMSd, logMFromEta);
  if (!Number.isFinite(chirpMass) || !(chirpMass > 0) || !Number.isFinite(totalLogMSd)) {
    return fail("non-physical-slope", "PN fit gives no finite positive chirp mass");
  }
  return succeed({
    trackKind: "time",
    chirpMassDetectorFrame: chirpMass,
    chirpMassDetectorFrameSd: chirpMass * totalLogMSd,
    chirpMassSdFromMassRatio: chirpMass * logMFromEta,
    coalescenceTimeS: point.tc,
    coalescenceTimeSd: Math.hypot(tcSd, dTc * etaSd),
    residualRmsHz: Math.sqrt(final.residualSumSq / n),
    reducedChiSquare: withSigma ? reducedChiSquare : null,
    uncertaintyScale,
    weighting: withSigma ? "per-sample-sigma" : "equal-frequency-uncertainty",
    samplesUsed: n,
    iterations: refined.value.iterations,
    model: { referenceFrequencyHz: fRef, amplitudePerS: Math.exp(logA) },
    eta,
    etaSd,
    frequencyAt: (tS: number) => pnFrequencyAt(table, point, tS),
  });
}
