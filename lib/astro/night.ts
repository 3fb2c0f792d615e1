import { type SiteLocation, sunAltitudeDeg } from "./site";

export interface Crossing {
  time: Date;
  /** True when the altitude goes from below the threshold to above it. */
  rising: boolean;
}

const MINUTE_MS = 60_000;

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

export interface Night {
  start: Date;
  end: Date;
  /** The site was already in astronomical night at `now`; start is `now`. */
  startsNow: boolean;
  /** The Sun stayed below the limit for searchHours after the start (polar night); end is that cap. */
  endCapped: boolean;
}

export interface NightOptions {
  /** Sun altitude that defines the night; −18° (astronomical twilight) by default. */
  sunAltitudeDeg?: number;
  /** How far ahead to look for the night to start, and for it to end; 24 h by default. */
  searchHours?: number;
  stepMinutes?: number;
}

/**
 * The coming astronomical night at a site: the rest of the current night if the Sun is already below
 * −18°, else the next interval with the Sun below −18° starting within searchHours. Null when there is
 * none (for example summer at high latitude, when the Sun never gets 18° below the horizon).
 */
export function comingNight(site: SiteLocation, now: Date, options: NightOptions = {}): Night | null {
  const limitDeg = options.sunAltitudeDeg ?? -18;
  const searchMs = (options.searchHours ?? 24) * 3_600_000;
  const step = options.stepMinutes ?? 10;
  const sunAt = (date: Date) => sunAltitudeDeg(site, date);
  const startsNow = sunAt(now) < limitDeg;
  let start = now;
  if (!startsNow) {
    const sunset = findCrossings(sunAt, now, new Date(now.getTime() + searchMs), limitDeg, step).find((c) => !c.rising);
    if (!sunset) return null;
    start = sunset.time;
  }
  const cap = new Date(start.getTime() + searchMs);
  const sunrise = findCrossings(sunAt, start, cap, limitDeg, step).find((c) => c.rising);
  return { start, end: sunrise?.time ?? cap, startsNow, endCapped: !sunrise };
}
