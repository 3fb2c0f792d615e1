/** The Sun from astronomy-engine (VSOP87 Earth, aberration included). */
import { Body, geocentricJ2000, geocentricOfDate, type GeocentricPosition } from "./engine";
import type { Equatorial } from "./coords";

export type SunPosition = GeocentricPosition;

/** Apparent geocentric position of the Sun, true equator and equinox of date. */
export function sunApparent(date: Date): SunPosition {
  return geocentricOfDate(Body.Sun, date);
}

/** The Sun for drawing on a J2000 sky map (geocentric, J2000 mean equator). */
export function sunPositionJ2000(date: Date): Equatorial {
  const { raDeg, decDeg } = geocentricJ2000(Body.Sun, date);
  return { raDeg, decDeg };
}
