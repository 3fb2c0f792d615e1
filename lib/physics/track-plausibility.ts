/**
 * Plausibility of an f(t) track before any fit: ground-based detectors see 1 Hz – 10 kHz, and a track spanning
 * more than 10⁴ s is most likely in milliseconds (limits are ours). A failing track is still stored with its
 * candidate; it only gets no chirp mass, with a reason that names the samples.
 */
import { fail, succeed, type PhysicsResult } from "./result";

export const MIN_TRACK_FREQUENCY_HZ = 1;
export const MAX_TRACK_FREQUENCY_HZ = 10_000;
export const MAX_TRACK_SPAN_S = 10_000;

export function checkTrackPlausibility(t: readonly number[], f: readonly number[]): PhysicsResult<null> {
  const outside: number[] = [];
  for (let i = 0; i < f.length; i++) {
    const fi = f[i] as number;
    if (fi < MIN_TRACK_FREQUENCY_HZ || fi > MAX_TRACK_FREQUENCY_HZ) outside.push(i);
  }
  if (outside.length > 0) {
    const shown = outside.slice(0, 5).map((i) => `f[${i}] = ${f[i]} Hz`).join(", ");
    const more = outside.length > 5 ? ` and ${outside.length - 5} more` : "";
    return fail("track-implausible", `${outside.length} samples outside ${MIN_TRACK_FREQUENCY_HZ} Hz–${MAX_TRACK_FREQUENCY_HZ / 1000} kHz (${shown}${more})`);
  }
  if (t.length >= 2) {
    const span = (t[t.length - 1] as number) - (t[0] as number);
    if (span > MAX_TRACK_SPAN_S) {
      return fail("track-implausible", `t[0] … t[${t.length - 1}] span ${span} s, over ${MAX_TRACK_SPAN_S} s: times in milliseconds?`);
    }
  }
  return succeed(null);
}
