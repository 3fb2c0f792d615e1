/**
 * The one place lib/astro talks to astronomy-engine (VSOP87 / ELP-based positions, IAU 2006 precession,
 * IAU 2000B nutation): observers, geocentric vectors and frame rotations. Pure: no HTTP, no SQL.
 */
import {
  Body,
  EquatorFromVector,
  GeoVector,
  MakeTime,
  Observer,
  RotateVector,
  Rotation_EQJ_EQD,
  type Vector,
} from "astronomy-engine";
import type { Equatorial } from "./coords";
import type { SiteLocation } from "./site";

export { Body };

export function observerAt(site: SiteLocation): Observer {
  return new Observer(site.latDeg, site.lonDeg, site.elevationM);
}

export interface GeocentricPosition extends Equatorial {
  distanceKm: number;
}

const AU_KM = 149_597_870.7;

function toPosition(vector: Vector): GeocentricPosition {
  const eq = EquatorFromVector(vector);
  return { raDeg: eq.ra * 15, decDeg: eq.dec, distanceKm: eq.dist * AU_KM };
}

/** Geocentric position with aberration, J2000 mean equator (for drawing on a J2000 sky map). */
export function geocentricJ2000(body: Body, date: Date): GeocentricPosition {
  return toPosition(GeoVector(body, date, true));
}

/** Apparent geocentric position: true equator and equinox of date (precession + nutation). */
export function geocentricOfDate(body: Body, date: Date): GeocentricPosition {
  const time = MakeTime(date);
  return toPosition(RotateVector(Rotation_EQJ_EQD(time), GeoVector(body, time, true)));
}
