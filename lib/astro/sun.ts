import { DEG, eclipticToEquatorial, type Equatorial, meanObliquityDeg, precess } from "./coords";
import { JD_J2000, julianCenturies, julianEphemerisDay, normaliseDeg } from "./time";

export const AU_KM = 149_597_870.7;

export interface SunPosition extends Equatorial {
  /** Apparent longitude, degrees. */
  longitudeDeg: number;
  distanceKm: number;
}

/**
 * Apparent geocentric position of the Sun, equator and equinox of date, low accuracy (0.01°):
 * Meeus, Astronomical Algorithms 2nd ed., ch. 25 (eqs. 25.2–25.8 with the ε correction of 25.8).
 */
export function sunApparent(jde: number): SunPosition {
  const t = julianCenturies(jde);
  const meanLongitude = 280.46646 + 36000.76983 * t + 0.0003032 * t * t;
  const meanAnomaly = (357.52911 + 35999.05029 * t - 0.0001537 * t * t) * DEG;
  const e = 0.016708634 - 0.000042037 * t - 0.0000001267 * t * t;
  const centre =
    (1.914602 - 0.004817 * t - 0.000014 * t * t) * Math.sin(meanAnomaly) +
    (0.019993 - 0.000101 * t) * Math.sin(2 * meanAnomaly) +
    0.000289 * Math.sin(3 * meanAnomaly);
  const trueLongitude = meanLongitude + centre;
  const trueAnomaly = meanAnomaly + centre * DEG;
  const distanceAu = (1.000001018 * (1 - e * e)) / (1 + e * Math.cos(trueAnomaly));
  const omega = (125.04 - 1934.136 * t) * DEG;
  const longitudeDeg = normaliseDeg(trueLongitude - 0.00569 - 0.00478 * Math.sin(omega));
  const obliquity = meanObliquityDeg(jde) + 0.00256 * Math.cos(omega);
  return { ...eclipticToEquatorial(longitudeDeg, 0, obliquity), longitudeDeg, distanceKm: distanceAu * AU_KM };
}

/** The Sun for drawing on a J2000 sky map: Meeus ch. 25 precessed back to J2000 (ch. 21), ~0.01°. */
export function sunPositionJ2000(date: Date): Equatorial {
  const jde = julianEphemerisDay(date);
  return precess(sunApparent(jde), jde, JD_J2000);
}
