/**
 * Scheduling primitives for follow-up planning, on astronomy-engine (VSOP87 / ELP-based, IAU 2006
 * precession and nutation): astronomical nights between two times, altitude and airmass of a J2000
 * position, the intervals a target stays above an altitude limit, and the Moon's distance from it.
 * Altitudes are geometric (no refraction), as in the rest of lib/astro. Pure: no HTTP, no SQL.
 */
import {
  Body,
  Equator,
  Horizon,
  Observer,
  RotateVector,
  Rotation_EQJ_HOR,
  SphereFromVector,
  Spherical,
  VectorFromSphere,
  MakeTime,
} from "astronomy-engine";
import { angularSeparationDeg, DEG, type Equatorial } from "./coords";
import { findCrossings } from "./crossings";
import type { SiteLocation } from "./site";

export interface TimeInterval {
  start: Date;
  end: Date;
}

/** Sun altitude that ends astronomical twilight (common practice). */
export const ASTRONOMICAL_NIGHT_SUN_DEG = -18;
/** Moon distance a site keeps from its pointings unless it says otherwise (our default). */
export const DEFAULT_MOON_DISTANCE_DEG = 20;

function observer(site: SiteLocation): Observer {
  return new Observer(site.latDeg, site.lonDeg, site.elevationM);
}

/** Geometric altitude of the Sun at a site (apparent topocentric position of date). */
export function sunAltitudeAtDeg(site: SiteLocation, date: Date): number {
  const obs = observer(site);
  const sun = Equator(Body.Sun, date, obs, true, true);
  return Horizon(date, obs, sun.ra, sun.dec).altitude;
}

/** Geometric altitude of a J2000 (ICRS) position: precession and nutation to date, no aberration (< 21″). */
export function targetAltitudeDeg(target: Equatorial, site: SiteLocation, date: Date): number {
  const time = MakeTime(date);
  const vector = VectorFromSphere(new Spherical(target.decDeg, target.raDeg, 1), time);
  return SphereFromVector(RotateVector(Rotation_EQJ_HOR(time, observer(site)), vector)).lat;
}

/** Plane-parallel airmass X = sec z (common practice); null at or below the horizon, where it means nothing. */
export function airmassAtAltitude(altDeg: number): number | null {
  return altDeg > 0 ? 1 / Math.cos((90 - altDeg) * DEG) : null;
}

export function targetAltitudeAndAirmass(
  target: Equatorial,
  site: SiteLocation,
  date: Date,
): { altDeg: number; airmass: number | null } {
  const altDeg = targetAltitudeDeg(target, site, date);
  return { altDeg, airmass: airmassAtAltitude(altDeg) };
}

/** Angle between a J2000 position and the Moon seen from the site (topocentric, J2000 frame). */
export function moonSeparationDeg(target: Equatorial, site: SiteLocation, date: Date): number {
  const moon = Equator(Body.Moon, date, observer(site), false, true);
  return angularSeparationDeg(target, { raDeg: moon.ra * 15, decDeg: moon.dec });
}

/**
 * Intervals within [from, to] where `inside(t)` holds, from the threshold crossings of altitudeAt:
 * sign changes on a stepMinutes grid refined by bisection. Excursions shorter than a step can be missed.
 */
function intervalsWhere(
  altitudeAt: (date: Date) => number,
  from: Date,
  to: Date,
  thresholdDeg: number,
  insideWhenAbove: boolean,
  stepMinutes: number,
): TimeInterval[] {
  if (!(to.getTime() > from.getTime())) return [];
  const startsInside = altitudeAt(from) >= thresholdDeg === insideWhenAbove;
  const intervals: TimeInterval[] = [];
  let openedAt: Date | null = startsInside ? from : null;
  for (const crossing of findCrossings(altitudeAt, from, to, thresholdDeg, stepMinutes)) {
    const entering = crossing.rising === insideWhenAbove;
    if (entering) openedAt = crossing.time;
    else if (openedAt) {
      intervals.push({ start: openedAt, end: crossing.time });
      openedAt = null;
    }
  }
  if (openedAt) intervals.push({ start: openedAt, end: to });
  return intervals;
}

export interface IntervalOptions {
  /** Grid for the crossing search; 10 min by default. */
  stepMinutes?: number;
}

/** Intervals between from and to with the Sun below −18° at the site (clipped to [from, to]). */
export function astronomicalNights(
  site: SiteLocation,
  from: Date,
  to: Date,
  options: IntervalOptions & { sunAltitudeDeg?: number } = {},
): TimeInterval[] {
  const limitDeg = options.sunAltitudeDeg ?? ASTRONOMICAL_NIGHT_SUN_DEG;
  return intervalsWhere((d) => sunAltitudeAtDeg(site, d), from, to, limitDeg, false, options.stepMinutes ?? 10);
}

/** Intervals between from and to while a J2000 position stays at or above minAltitudeDeg. */
export function intervalsAboveAltitude(
  target: Equatorial,
  site: SiteLocation,
  from: Date,
  to: Date,
  minAltitudeDeg: number,
  options: IntervalOptions = {},
): TimeInterval[] {
  const altitudeAt = (d: Date) => targetAltitudeDeg(target, site, d);
  return intervalsWhere(altitudeAt, from, to, minAltitudeDeg, true, options.stepMinutes ?? 10);
}

/** Overlap of two sorted interval lists (for example nights ∩ target above the limit). */
export function intersectIntervals(a: TimeInterval[], b: TimeInterval[]): TimeInterval[] {
  const out: TimeInterval[] = [];
  let i = 0;
  let j = 0;
  for (let x = a[i], y = b[j]; x && y; x = a[i], y = b[j]) {
    const start = Math.max(x.start.getTime(), y.start.getTime());
    const end = Math.min(x.end.getTime(), y.end.getTime());
    if (end > start) out.push({ start: new Date(start), end: new Date(end) });
    if (x.end.getTime() < y.end.getTime()) i++;
    else j++;
  }
  return out;
}
