import { SearchAltitude } from "astronomy-engine";
import { Body, observerAt } from "./engine";
import { sunAltitudeAtDeg } from "./schedule";
import type { SiteLocation } from "./site";

export { findCrossings, type Crossing } from "./crossings";

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
}

/**
 * The coming astronomical night at a site: the rest of the current night if the Sun is already below
 * −18°, else the next interval with the Sun below −18° starting within searchHours. Null when there is
 * none (for example summer at high latitude, when the Sun never gets 18° below the horizon). The Sun's
 * crossings come from astronomy-engine's SearchAltitude (geometric altitude of the Sun's centre).
 */
export function comingNight(site: SiteLocation, now: Date, options: NightOptions = {}): Night | null {
  const limitDeg = options.sunAltitudeDeg ?? -18;
  const searchDays = (options.searchHours ?? 24) / 24;
  const observer = observerAt(site);
  const startsNow = sunAltitudeAtDeg(site, now) < limitDeg;
  let start = now;
  if (!startsNow) {
    const sunset = SearchAltitude(Body.Sun, observer, -1, now, searchDays, limitDeg);
    if (!sunset) return null;
    start = sunset.date;
  }
  const cap = new Date(start.getTime() + searchDays * 86_400_000);
  const sunrise = SearchAltitude(Body.Sun, observer, +1, start, searchDays, limitDeg);
  return { start, end: sunrise?.date ?? cap, startsNow, endCapped: !sunrise };
}
