/** Coordinate transformations (Meeus, Astronomical Algorithms 2nd ed.). Angles in degrees. */
import { JD_J2000, julianCenturies, normaliseDeg } from "./time";

export const DEG = Math.PI / 180;
const ARCSEC = DEG / 3600;

export interface Equatorial {
  raDeg: number;
  decDeg: number;
}

/**
 * Rigorous precession of equatorial coordinates between two epochs given as Julian Ephemeris Days
 * (Meeus eqs. 21.2–21.4, IAU 1976 angles ζ, z, θ). Ignores proper motion, nutation and aberration.
 */
export function precess(position: Equatorial, jdeFrom: number, jdeTo: number): Equatorial {
  const T = (jdeFrom - JD_J2000) / 36_525;
  const t = (jdeTo - jdeFrom) / 36_525;
  const base = 2306.2181 + 1.39656 * T - 0.000139 * T * T;
  const zeta = (base * t + (0.30188 - 0.000344 * T) * t * t + 0.017998 * t ** 3) * ARCSEC;
  const z = (base * t + (1.09468 + 0.000066 * T) * t * t + 0.018203 * t ** 3) * ARCSEC;
  const theta =
    ((2004.3109 - 0.8533 * T - 0.000217 * T * T) * t - (0.42665 + 0.000217 * T) * t * t - 0.041833 * t ** 3) *
    ARCSEC;
  const ra0 = position.raDeg * DEG;
  const dec0 = position.decDeg * DEG;
  const a = Math.cos(dec0) * Math.sin(ra0 + zeta);
  const b = Math.cos(theta) * Math.cos(dec0) * Math.cos(ra0 + zeta) - Math.sin(theta) * Math.sin(dec0);
  const c = Math.sin(theta) * Math.cos(dec0) * Math.cos(ra0 + zeta) + Math.cos(theta) * Math.sin(dec0);
  return {
    raDeg: normaliseDeg((Math.atan2(a, b) + z) / DEG),
    decDeg: Math.asin(Math.max(-1, Math.min(1, c))) / DEG,
  };
}

/** Mean obliquity of the ecliptic (Meeus eq. 22.2). */
export function meanObliquityDeg(jde: number): number {
  const t = julianCenturies(jde);
  return 23 + 26 / 60 + (21.448 - 46.815 * t - 0.00059 * t * t + 0.001813 * t ** 3) / 3600;
}

/** Nutation in longitude and obliquity, low-precision series good to 0.5″ / 0.1″ (Meeus ch. 22). */
export function nutationDeg(jde: number): { longitudeDeg: number; obliquityDeg: number } {
  const t = julianCenturies(jde);
  const omega = (125.04452 - 1934.136261 * t) * DEG;
  const sunLongitude = (280.4665 + 36000.7698 * t) * DEG;
  const moonLongitude = (218.3165 + 481267.8813 * t) * DEG;
  const dPsi = -17.2 * Math.sin(omega) - 1.32 * Math.sin(2 * sunLongitude) - 0.23 * Math.sin(2 * moonLongitude) + 0.21 * Math.sin(2 * omega);
  const dEps = 9.2 * Math.cos(omega) + 0.57 * Math.cos(2 * sunLongitude) + 0.1 * Math.cos(2 * moonLongitude) - 0.09 * Math.cos(2 * omega);
  return { longitudeDeg: dPsi / 3600, obliquityDeg: dEps / 3600 };
}

/** Ecliptic (λ, β) to equatorial coordinates for obliquity ε (Meeus eqs. 13.3, 13.4). */
export function eclipticToEquatorial(lonDeg: number, latDeg: number, obliquityDeg: number): Equatorial {
  const l = lonDeg * DEG;
  const b = latDeg * DEG;
  const e = obliquityDeg * DEG;
  const ra = Math.atan2(Math.sin(l) * Math.cos(e) - Math.tan(b) * Math.sin(e), Math.cos(l));
  const dec = Math.asin(Math.sin(b) * Math.cos(e) + Math.cos(b) * Math.sin(e) * Math.sin(l));
  return { raDeg: normaliseDeg(ra / DEG), decDeg: dec / DEG };
}

/**
 * Altitude and azimuth from hour angle and declination at latitude φ (Meeus eqs. 13.5, 13.6);
 * azimuth here is measured from north through east (Meeus counts from south).
 */
export function equatorialToHorizontal(hourAngleDeg: number, decDeg: number, latDeg: number): { altDeg: number; azDeg: number } {
  const h = hourAngleDeg * DEG;
  const d = decDeg * DEG;
  const p = latDeg * DEG;
  const alt = Math.asin(Math.sin(p) * Math.sin(d) + Math.cos(p) * Math.cos(d) * Math.cos(h));
  const azFromSouth = Math.atan2(Math.sin(h), Math.cos(h) * Math.sin(p) - Math.tan(d) * Math.cos(p));
  return { altDeg: alt / DEG, azDeg: normaliseDeg(azFromSouth / DEG + 180) };
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
