/** Input checks for f(t) tracks: a bad track is a typed failure with a reason, never a throw. */
import { fail, succeed, type PhysicsResult } from "./result";

export interface TimeTrackInput {
  t: readonly number[];
  f: readonly number[];
  fSigma?: readonly number[] | undefined;
}

// What the scan found; the sample index goes in `scan[0]`.
const OK = 0;
const NON_FINITE_SAMPLE = 1;
const NON_POSITIVE_FREQUENCY = 2;
const NON_FINITE_SIGMA = 3;
const NON_POSITIVE_SIGMA = 4;
const TIMES_NOT_INCREASING = 5;

/**
 * One pass over the samples: a finding code, with the sample index, the highest frequency and the sign of the
 * t–f covariance in `out`. Only numbers in and out, so V8 keeps the loop's doubles unboxed (a loop that builds
 * failure objects allocated one number per sample here).
 */
function scanTrack(t: readonly number[], f: readonly number[], fSigma: readonly number[] | undefined, out: Float64Array): number {
  const n = f.length;
  const t0 = t[0] as number;
  const f0 = f[0] as number;
  let sumT = 0;
  let sumF = 0;
  let sumTF = 0;
  let maxFrequencyHz = 0;
  let previousT = -Infinity;
  let code = OK;
  let i = 0;
  for (; i < n; i++) {
    const ti = t[i] as number;
    const fi = f[i] as number;
    // x − x is 0 for a finite number and NaN for ±∞ and NaN.
    if (!(ti - ti === 0) || !(fi - fi === 0)) {
      code = NON_FINITE_SAMPLE;
      break;
    }
    if (!(fi > 0)) {
      code = NON_POSITIVE_FREQUENCY;
      break;
    }
    if (fSigma !== undefined) {
      const si = fSigma[i] as number;
      if (!(si - si === 0)) {
        code = NON_FINITE_SIGMA;
        break;
      }
      if (!(si > 0)) {
        code = NON_POSITIVE_SIGMA;
        break;
      }
    }
    if (!(ti > previousT)) {
      code = TIMES_NOT_INCREASING;
      break;
    }
    previousT = ti;
    if (fi > maxFrequencyHz) maxFrequencyHz = fi;
    // Shifted sums keep the covariance accurate when t and f sit far from zero.
    sumT += ti - t0;
    sumF += fi - f0;
    sumTF += (ti - t0) * (fi - f0);
  }
  out[0] = i;
  out[1] = maxFrequencyHz;
  out[2] = sumTF - (sumT * sumF) / n;
  return code;
}

/** Checks the track; on success returns the highest frequency (Hz), used as the fit's reference. */
export function validateTimeTrack(track: TimeTrackInput): PhysicsResult<{ maxFrequencyHz: number }> {
  const { t, f, fSigma } = track;
  if (!Array.isArray(t) || !Array.isArray(f)) return fail("missing-input", "track needs arrays t and f");
  if (t.length !== f.length) return fail("length-mismatch", `t has ${t.length} samples, f has ${f.length}`);
  if (fSigma !== undefined && (!Array.isArray(fSigma) || fSigma.length !== f.length)) {
    return fail("length-mismatch", `fSigma has ${fSigma?.length} samples, f has ${f.length}`);
  }
  const n = f.length;
  if (n < 3) return fail("too-few-samples", `${n} usable samples, need at least 3`);
  const out = new Float64Array(3);
  const code = scanTrack(t, f, fSigma, out);
  const i = out[0] as number;
  switch (code) {
    case NON_FINITE_SAMPLE:
      return fail("non-finite-value", `sample ${i} is not a finite number`);
    case NON_POSITIVE_FREQUENCY:
      return fail("non-positive-frequency", `sample ${i} has frequency ${f[i]} Hz`);
    case NON_FINITE_SIGMA:
      return fail("non-finite-value", `fSigma ${i} is not finite`);
    case NON_POSITIVE_SIGMA:
      return fail("non-positive-uncertainty", `fSigma ${i} is ${fSigma?.[i]}`);
    case TIMES_NOT_INCREASING:
      return fail("times-not-increasing", `t[${i}] ≤ t[${i - 1}]`);
  }
  if (!((out[2] as number) > 0)) return fail("frequency-not-rising", "frequency does not increase with time over the track");
  return succeed({ maxFrequencyHz: out[1] as number });
}
