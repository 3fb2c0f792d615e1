import { DEG, type Equatorial, equatorialToHorizontal, precess } from "./coords";
import { moonApparent } from "./moon";
import { sunApparent } from "./sun";
import { JD_J2000, julianDay, julianEphemerisDay, localSiderealTimeDeg, normaliseDeg } from "./time";

export interface Site {
  latDeg: number;
  /** Longitude, positive east. */
  lonDeg: number;
  elevationM: number;
  /** Lowest usable altitude (see airmassToAltitudeDeg for an airmass limit). */
  minAltitudeDeg: number;
}

export type SiteLocation = Pick<Site, "latDeg" | "lonDeg" | "elevationM">;

const EARTH_EQUATORIAL_RADIUS_KM = 6378.14;

/** Geometric altitude (no refraction) of a position given in the equator and equinox of date. */
export function altitudeOfDateDeg(position: Equatorial, site: SiteLocation, date: Date): number {
  const hourAngle = localSiderealTimeDeg(julianDay(date), site.lonDeg) - position.raDeg;
  return equatorialToHorizontal(hourAngle, position.decDeg, site.latDeg).altDeg;
}

/**
 * Geometric altitude of a J2000 (ICRS) position: precession to date (Meeus ch. 21), mean sidereal
 * time (ch. 12), horizontal coordinates (ch. 13). Nutation and aberration are left out (< 30″).
 */
export function altitudeDeg(position: Equatorial, site: SiteLocation, date: Date): number {
  return altitudeOfDateDeg(precess(position, JD_J2000, julianEphemerisDay(date)), site, date);
}

export function sunAltitudeDeg(site: SiteLocation, date: Date): number {
  return altitudeOfDateDeg(sunApparent(julianEphemerisDay(date)), site, date);
}

/**
 * Topocentric equatorial position of the Moon (equinox of date): the observer's geocentric vector
 * (ρ sin φ′, ρ cos φ′ of Meeus ch. 11) subtracted from the Moon's — the vector form of Meeus ch. 40.
 */
export function moonTopocentric(site: SiteLocation, date: Date): Equatorial & { distanceKm: number } {
  const moon = moonApparent(julianEphemerisDay(date));
  const lat = site.latDeg * DEG;
  const u = Math.atan(0.99664719 * Math.tan(lat));
  const heightRatio = site.elevationM / (EARTH_EQUATORIAL_RADIUS_KM * 1000);
  const rhoSin = 0.99664719 * Math.sin(u) + heightRatio * Math.sin(lat);
  const rhoCos = Math.cos(u) + heightRatio * Math.cos(lat);
  const lst = localSiderealTimeDeg(julianDay(date), site.lonDeg) * DEG;
  const ra = moon.raDeg * DEG;
  const dec = moon.decDeg * DEG;
  const x = moon.distanceKm * Math.cos(dec) * Math.cos(ra) - EARTH_EQUATORIAL_RADIUS_KM * rhoCos * Math.cos(lst);
  const y = moon.distanceKm * Math.cos(dec) * Math.sin(ra) - EARTH_EQUATORIAL_RADIUS_KM * rhoCos * Math.sin(lst);
  const z = moon.distanceKm * Math.sin(dec) - EARTH_EQUATORIAL_RADIUS_KM * rhoSin;
  return {
    raDeg: normaliseDeg(Math.atan2(y, x) / DEG),
    decDeg: Math.atan2(z, Math.hypot(x, y)) / DEG,
    distanceKm: Math.hypot(x, y, z),
  };
}

export function moonAltitudeDeg(site: SiteLocation, date: Date): number {
  return altitudeOfDateDeg(moonTopocentric(site, date), site, date);
}
