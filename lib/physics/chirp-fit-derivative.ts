/**
 * Chirp mass from (f, df/dt) pairs: df/dt = (96/5) π^(8/3) (G𝓜/c³)^(5/3) f^(11/3), Peters & Mathews 1963.
 * Each pair gives ln K_i = ln(df/dt)_i − (11/3) ln f_i; we take the weighted mean of ln K (σ_lnK = σ_df/dt / df/dt).
 * Frequencies in Hz, df/dt in Hz/s, chirp mass in the detector frame. Pairs carry no times, so no t_c.
 */
import { CHIRP_DERIVATIVE_COEFFICIENT, chirpMassFromLogAmplitude } from "./chirp";
import { fail, succeed, type PhysicsResult } from "./result";

export interface DerivativeTrackFit {
  trackKind: "derivative";
  chirpMassDetectorFrame: number;
  chirpMassDetectorFrameSd: number;
  /** RMS of (df/dt observed / df/dt model − 1), dimensionless. */
  residualRmsFraction: number;
  reducedChiSquare: number | null;
  uncertaintyScale: number;
  weighting: "per-sample-sigma" | "equal-relative-uncertainty";
  samplesUsed: number;
  /** ln K of the fit, K = (96/5) π^(8/3) (G𝓜/c³)^(5/3) in s^(−5/3)·…, kept for plotting. */
  logK: number;
  residualsFraction: Float64Array;
}

export interface DerivativeTrackInput {
  f: readonly number[];
  dfdt: readonly number[];
  dfdtSigma?: readonly number[] | undefined;
}

function validate(track: DerivativeTrackInput): PhysicsResult<null> {
  const { f, dfdt, dfdtSigma } = track;
  if (!Array.isArray(f) || !Array.isArray(dfdt)) return fail("missing-input", "track needs arrays f and dfdt");
  if (f.length !== dfdt.length) return fail("length-mismatch", `f has ${f.length} samples, dfdt has ${dfdt.length}`);
  if (dfdtSigma !== undefined && dfdtSigma.length !== f.length) {
    return fail("length-mismatch", `dfdtSigma has ${dfdtSigma.length} samples, f has ${f.length}`);
  }
  if (f.length < 3) return fail("too-few-samples", `${f.length} usable samples, need at least 3`);
  for (let i = 0; i < f.length; i++) {
    const fi = f[i] as number;
    const di = dfdt[i] as number;
    if (!Number.isFinite(fi) || !Number.isFinite(di)) return fail("non-finite-value", `sample ${i} is not finite`);
    if (fi <= 0) return fail("non-positive-frequency", `sample ${i} has frequency ${fi} Hz`);
    if (di <= 0) return fail("frequency-not-rising", `sample ${i} has df/dt = ${di} Hz/s`);
    if (dfdtSigma !== undefined) {
      const si = dfdtSigma[i] as number;
      if (!Number.isFinite(si)) return fail("non-finite-value", `dfdtSigma ${i} is not finite`);
      if (si <= 0) return fail("non-positive-uncertainty", `dfdtSigma ${i} is ${si}`);
    }
  }
  return succeed(null);
}

/** Weighted mean of ln K over (f, df/dt) pairs; see the module comment for the relation and its source. */
export function fitDerivativeTrack(track: DerivativeTrackInput): PhysicsResult<DerivativeTrackFit> {
  const checked = validate(track);
  if (!checked.ok) return checked;
  const { f, dfdt, dfdtSigma } = track;
  const n = f.length;
  const logK = new Float64Array(n);
  const w = new Float64Array(n);
  let sumW = 0;
  let sumWk = 0;
  for (let i = 0; i < n; i++) {
    const di = dfdt[i] as number;
    logK[i] = Math.log(di) - (11 / 3) * Math.log(f[i] as number);
    w[i] = dfdtSigma === undefined ? 1 : (di / (dfdtSigma[i] as number)) ** 2;
    sumW += w[i] as number;
    sumWk += (w[i] as number) * (logK[i] as number);
  }
  if (!(sumW > 0) || !Number.isFinite(sumW)) return fail("degenerate-fit", "sample weights underflow or overflow");
  const meanLogK = sumWk / sumW;
  let chiSquare = 0;
  let residualSumSq = 0;
  const residualsFraction = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const r = (logK[i] as number) - meanLogK;
    chiSquare += (w[i] as number) * r * r;
    residualsFraction[i] = Math.expm1(r);
    residualSumSq += (residualsFraction[i] as number) ** 2;
  }
  const reducedChiSquare = chiSquare / (n - 1);
  const uncertaintyScale =
    dfdtSigma === undefined ? Math.sqrt(reducedChiSquare) : Math.sqrt(Math.max(1, reducedChiSquare));
  const logKSd = uncertaintyScale / Math.sqrt(sumW);
  const chirpMassDetectorFrame = chirpMassFromLogAmplitude(meanLogK - Math.log(CHIRP_DERIVATIVE_COEFFICIENT));
  if (!Number.isFinite(chirpMassDetectorFrame) || !(chirpMassDetectorFrame > 0)) {
    return fail("non-physical-slope", "df/dt values give no finite positive chirp mass");
  }
  return succeed({
    trackKind: "derivative",
    chirpMassDetectorFrame,
    chirpMassDetectorFrameSd: chirpMassDetectorFrame * (3 / 5) * logKSd,
    residualRmsFraction: Math.sqrt(residualSumSq / n),
    reducedChiSquare: dfdtSigma === undefined ? null : reducedChiSquare,
    uncertaintyScale,
    weighting: dfdtSigma === undefined ? "equal-relative-uncertainty" : "per-sample-sigma",
    samplesUsed: n,
    logK: meanLogK,
    residualsFraction,
  });
}
