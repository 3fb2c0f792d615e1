/** Input checks for f(t) tracks: a bad track is a typed failure with a reason, never a throw. */
import { fail, succeed, type PhysicsResult } from "./result";

export interface TimeTrackInput {
  t: readonly number[];
  f: readonly number[];
  fSigma?: readonly number[] | undefined;
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
  const t0 = t[0] as number;
  const f0 = f[0] as number;
  let sumT = 0;
  let sumF = 0;
  let sumTF = 0;
  let maxFrequencyHz = 0;
  for (let i = 0; i < n; i++) {
    const ti = t[i] as number;
    const fi = f[i] as number;
    if (!Number.isFinite(ti) || !Number.isFinite(fi)) {
      return fail("non-finite-value", `sample ${i} is not a finite number`);
    }
    if (fi <= 0) return fail("non-positive-frequency", `sample ${i} has frequency ${fi} Hz`);
    if (fSigma !== undefined) {
      const si = fSigma[i] as number;
      if (!Number.isFinite(si)) return fail("non-finite-value", `fSigma ${i} is not finite`);
      if (si <= 0) return fail("non-positive-uncertainty", `fSigma ${i} is ${si}`);
    }
    if (i > 0 && !(ti > (t[i - 1] as number))) return fail("times-not-increasing", `t[${i}] ≤ t[${i - 1}]`);
    if (fi > maxFrequencyHz) maxFrequencyHz = fi;
    // Shifted sums keep the covariance accurate when t and f sit far from zero.
    sumT += ti - t0;
    sumF += fi - f0;
    sumTF += (ti - t0) * (fi - f0);
  }
  if (!(sumTF - (sumT * sumF) / n > 0)) return fail("frequency-not-rising", "frequency does not increase with time over the track");
  return succeed({ maxFrequencyHz });
}
