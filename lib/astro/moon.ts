import { DEG, eclipticToEquatorial, type Equatorial, meanObliquityDeg, nutationDeg, precess } from "./coords";
import { MOON_LATITUDE_TERMS, MOON_LONGITUDE_DISTANCE_TERMS } from "./moon-terms";
import { sunApparent } from "./sun";
import { JD_J2000, julianCenturies, julianEphemerisDay, normaliseDeg } from "./time";

export interface MoonPosition extends Equatorial {
  longitudeDeg: number;
  latitudeDeg: number;
  distanceKm: number;
}

/**
 * Apparent geocentric position of the Moon, equator and equinox of date: Meeus, Astronomical
 * Algorithms 2nd ed., ch. 47 (eqs. 47.1–47.7, the full 60-term Tables 47.A/47.B, about 10″ in
 * longitude), with the low-precision nutation of ch. 22.
 */
export function moonApparent(jde: number): MoonPosition {
  const t = julianCenturies(jde);
  const lp = 218.3164477 + 481267.88123421 * t - 0.0015786 * t * t + t ** 3 / 538_841 - t ** 4 / 65_194_000;
  const d = 297.8501921 + 445267.1114034 * t - 0.0018819 * t * t + t ** 3 / 545_868 - t ** 4 / 113_065_000;
  const m = 357.5291092 + 35999.0502909 * t - 0.0001536 * t * t + t ** 3 / 24_490_000;
  const mp = 134.9633964 + 477198.8675055 * t + 0.0087414 * t * t + t ** 3 / 69_699 - t ** 4 / 14_712_000;
  const f = 93.272095 + 483202.0175233 * t - 0.0036539 * t * t - t ** 3 / 3_526_000 + t ** 4 / 863_310_000;
  const a1 = 119.75 + 131.849 * t;
  const a2 = 53.09 + 479264.29 * t;
  const a3 = 313.45 + 481266.484 * t;
  const e = 1 - 0.002516 * t - 0.0000074 * t * t; // eq. 47.6: Earth-orbit eccentricity factor

  let sumL = 0;
  let sumR = 0;
  for (const [cd, cm, cmp, cf, l, r] of MOON_LONGITUDE_DISTANCE_TERMS) {
    const arg = (cd * d + cm * m + cmp * mp + cf * f) * DEG;
    const factor = e ** Math.abs(cm);
    sumL += l * factor * Math.sin(arg);
    sumR += r * factor * Math.cos(arg);
  }
  let sumB = 0;
  for (const [cd, cm, cmp, cf, b] of MOON_LATITUDE_TERMS) {
    sumB += b * e ** Math.abs(cm) * Math.sin((cd * d + cm * m + cmp * mp + cf * f) * DEG);
  }
  sumL += 3958 * Math.sin(a1 * DEG) + 1962 * Math.sin((lp - f) * DEG) + 318 * Math.sin(a2 * DEG);
  sumB +=
    -2235 * Math.sin(lp * DEG) +
    382 * Math.sin(a3 * DEG) +
    175 * Math.sin((a1 - f) * DEG) +
    175 * Math.sin((a1 + f) * DEG) +
    127 * Math.sin((lp - mp) * DEG) -
    115 * Math.sin((lp + mp) * DEG);

  const nutation = nutationDeg(jde);
  const longitudeDeg = normaliseDeg(lp + sumL / 1e6 + nutation.longitudeDeg);
  const latitudeDeg = sumB / 1e6;
  const obliquity = meanObliquityDeg(jde) + nutation.obliquityDeg;
  return {
    ...eclipticToEquatorial(longitudeDeg, latitudeDeg, obliquity),
    longitudeDeg,
    latitudeDeg,
    distanceKm: 385000.56 + sumR / 1000,
  };
}

/** The Moon for drawing on a J2000 sky map (geocentric; precessed back with Meeus ch. 21). */
export function moonPositionJ2000(date: Date): Equatorial {
  const jde = julianEphemerisDay(date);
  return precess(moonApparent(jde), jde, JD_J2000);
}

/**
 * Illuminated fraction of the Moon's disk, k = (1 + cos i) / 2 with the phase angle i from the
 * geocentric elongation ψ (Meeus eqs. 48.1–48.3).
 */
export function moonIlluminatedFraction(jde: number): number {
  const moon = moonApparent(jde);
  const sun = sunApparent(jde);
  const cosPsi =
    Math.sin(sun.decDeg * DEG) * Math.sin(moon.decDeg * DEG) +
    Math.cos(sun.decDeg * DEG) * Math.cos(moon.decDeg * DEG) * Math.cos((sun.raDeg - moon.raDeg) * DEG);
  const psi = Math.acos(Math.max(-1, Math.min(1, cosPsi)));
  const phaseAngle = Math.atan2(sun.distanceKm * Math.sin(psi), moon.distanceKm - sun.distanceKm * Math.cos(psi));
  return (1 + Math.cos(phaseAngle)) / 2;
}
