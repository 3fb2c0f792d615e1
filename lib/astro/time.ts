/** Julian days and sidereal time. Angles in degrees unless a name says otherwise. */
import { SiderealTime } from "astronomy-engine";

const MS_PER_DAY = 86_400_000;
/** Julian Day of the Unix epoch, 1970-01-01T00:00Z (Meeus, Astronomical Algorithms 2nd ed., ch. 7). */
const JD_UNIX_EPOCH = 2_440_587.5;
export const JD_J2000 = 2_451_545.0;

/** Julian Day (UTC, taken as UT1: |UT1 − UTC| < 0.9 s) of an instant. */
export function julianDay(date: Date): number {
  return date.getTime() / MS_PER_DAY + JD_UNIX_EPOCH;
}

export function dateFromJulianDay(jd: number): Date {
  return new Date((jd - JD_UNIX_EPOCH) * MS_PER_DAY);
}

export function normaliseDeg(angle: number): number {
  const r = angle % 360;
  return r < 0 ? r + 360 : r;
}

/**
 * Greenwich apparent sidereal time in degrees (astronomy-engine, IAU 2006 with the equation of the
 * equinoxes): the hour angle of the true equinox of date, what positions of date need.
 */
export function greenwichSiderealTimeDeg(date: Date): number {
  return SiderealTime(date) * 15;
}

/** Local apparent sidereal time in degrees; longitude positive east. */
export function localSiderealTimeDeg(date: Date, lonDeg: number): number {
  return normaliseDeg(greenwichSiderealTimeDeg(date) + lonDeg);
}
