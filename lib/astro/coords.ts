/** Angles on the sphere and frame changes for J2000 positions. Angles in degrees. */
import { MakeTime, RotateVector, Rotation_EQJ_EQD, SphereFromVector, Spherical, VectorFromSphere } from "astronomy-engine";
import { normaliseDeg } from "./time";

export const DEG = Math.PI / 180;

export interface Equatorial {
  raDeg: number;
  decDeg: number;
}

/**
 * A J2000 (ICRS) direction in the true equator and equinox of `date`: astronomy-engine's IAU 2006
 * precession and IAU 2000B nutation. Proper motion and aberration are left out (< 21″ for aberration).
 */
export function j2000ToOfDate(position: Equatorial, date: Date): Equatorial {
  const time = MakeTime(date);
  const vector = VectorFromSphere(new Spherical(position.decDeg, position.raDeg, 1), time);
  const s = SphereFromVector(RotateVector(Rotation_EQJ_EQD(time), vector));
  return { raDeg: normaliseDeg(s.lon), decDeg: s.lat };
}

/** Angular separation (Meeus eq. 17.1 in the haversine form recommended there for small angles). */
export function angularSeparationDeg(a: Equatorial, b: Equatorial): number {
  const h =
    Math.sin(((b.decDeg - a.decDeg) * DEG) / 2) ** 2 +
    Math.cos(a.decDeg * DEG) * Math.cos(b.decDeg * DEG) * Math.sin(((b.raDeg - a.raDeg) * DEG) / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(h)))) / DEG;
}

/** Altitude for the highest usable airmass X, plane-parallel atmosphere X = sec z (common practice). */
export function airmassToAltitudeDeg(airmass: number): number {
  if (!(airmass >= 1)) throw new RangeError(`airmass must be ≥ 1, got ${airmass}`);
  return 90 - Math.acos(1 / airmass) / DEG;
}
