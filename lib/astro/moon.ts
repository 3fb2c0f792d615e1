/** The Moon from astronomy-engine (its ELP/MPP02-derived lunar theory, aberration included). */
import { Illumination } from "astronomy-engine";
import { Body, geocentricJ2000, geocentricOfDate, type GeocentricPosition } from "./engine";
import type { Equatorial } from "./coords";

export type MoonPosition = GeocentricPosition;

/** Apparent geocentric position of the Moon, true equator and equinox of date. */
export function moonApparent(date: Date): MoonPosition {
  return geocentricOfDate(Body.Moon, date);
}

/** The Moon for drawing on a J2000 sky map (geocentric, J2000 mean equator). */
export function moonPositionJ2000(date: Date): Equatorial {
  const { raDeg, decDeg } = geocentricJ2000(Body.Moon, date);
  return { raDeg, decDeg };
}

/** Illuminated fraction of the Moon's disk, 0–1 (astronomy-engine's phase fraction, (1 + cos i) / 2). */
export function moonIlluminatedFraction(date: Date): number {
  return Illumination(Body.Moon, date).phase_fraction;
}
