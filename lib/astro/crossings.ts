/** Threshold crossings of a sampled function of time (altitudes of targets, the Sun, …). */
const MINUTE_MS = 60_000;

export interface Crossing {
  time: Date;
  /** True when the altitude goes from below the threshold to above it. */
  rising: boolean;
}

/**
 * Times where altitudeAt(t) crosses thresholdDeg between start and end: sign changes on a grid of
 * stepMinutes, each refined by bisection to under a second. Excursions shorter than a step can be missed.
 */
export function findCrossings(
  altitudeAt: (date: Date) => number,
  start: Date,
  end: Date,
  thresholdDeg: number,
  stepMinutes = 10,
): Crossing[] {
  const crossings: Crossing[] = [];
  const stepMs = stepMinutes * MINUTE_MS;
  let previousMs = start.getTime();
  let previousAbove = altitudeAt(start) >= thresholdDeg;
  while (previousMs < end.getTime()) {
    const nextMs = Math.min(previousMs + stepMs, end.getTime());
    const nextAbove = altitudeAt(new Date(nextMs)) >= thresholdDeg;
    if (nextAbove !== previousAbove) {
      let lo = previousMs;
      let hi = nextMs;
      while (hi - lo > 500) {
        const mid = (lo + hi) / 2;
        if ((altitudeAt(new Date(mid)) >= thresholdDeg) === previousAbove) lo = mid;
        else hi = mid;
      }
      crossings.push({ time: new Date(Math.round((lo + hi) / 2)), rising: nextAbove });
    }
    previousMs = nextMs;
    previousAbove = nextAbove;
  }
  return crossings;
}
