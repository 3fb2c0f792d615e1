/** Time scales and sidereal time. Angles in degrees unless a name says otherwise. */

const MS_PER_DAY = 86_400_000;
/** Julian Day of the Unix epoch, 1970-01-01T00:00Z (Meeus, Astronomical Algorithms 2nd ed., ch. 7). */
const JD_UNIX_EPOCH = 2_440_587.5;
export const JD_J2000 = 2_451_545.0;

/**
 * TT − UTC in seconds: 32.184 s + 37 leap seconds, valid from 2017-01-01 while no further leap second
 * is inserted (IERS Bulletin C; value from memory). Earlier dates are off by up to a few seconds,
 * which moves the Moon by < 2″.
 */
export const TT_MINUS_UTC_S = 69.184;

/** Julian Day (UTC, taken as UT1: |UT1 − UTC| < 0.9 s) of an instant. */
export function julianDay(date: Date): number {
  return date.getTime() / MS_PER_DAY + JD_UNIX_EPOCH;
}

/** Julian Ephemeris Day (TT) of an instant. */
export function julianEphemerisDay(date: Date): number {
  return julianDay(date) + TT_MINUS_UTC_S / 86_400;
}

export function dateFromJulianDay(jd: number): Date {
  return new Date((jd - JD_UNIX_EPOCH) * MS_PER_DAY);
}

/** Julian centuries since J2000.0 (Meeus eq. 12.1 / 22.1). */
export function julianCenturies(jd: number): number {
  return (jd - JD_J2000) / 36_525;
}

export function normaliseDeg(angle: number): number {
  const r = angle % 360;
  return r < 0 ? r + 360 : r;
}

/** Greenwich mean sidereal time in degrees for a UT Julian Day (Meeus eq. 12.4). */
export function greenwichMeanSiderealTimeDeg(jdUt: number): number {
  const t = julianCenturies(jdUt);
  return normaliseDeg(
    280.46061837 + 360.98564736629 * (jdUt - JD_J2000) + 0.000387933 * t * t - (t * t * t) / 38_710_000,
  );
}

/** Local mean sidereal time in degrees; longitude positive east (Meeus ch. 12–13, sign as in IAU use). */
export function localSiderealTimeDeg(jdUt: number, lonDeg: number): number {
  return normaliseDeg(greenwichMeanSiderealTimeDeg(jdUt) + lonDeg);
}
