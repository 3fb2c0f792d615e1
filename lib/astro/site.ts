/** Altitudes at a site, from astronomy-engine. Altitudes are geometric (no refraction). */
import { Equator, Horizon } from "astronomy-engine";
import type { Equatorial } from "./coords";
import { Body, observerAt } from "./engine";
import { sunAltitudeAtDeg, targetAltitudeDeg } from "./schedule";

export interface Site {
  latDeg: number;
  /** Longitude, positive east. */
  lonDeg: number;
  elevationM: number;
  /** Lowest usable altitude (see airmassToAltitudeDeg for an airmass limit). */
  minAltitudeDeg: number;
}

export type SiteLocation = Pick<Site, "latDeg" | "lonDeg" | "elevationM">;

const AU_KM = 149_597_870.7;

/** Geometric altitude (no refraction) of a position given in the true equator and equinox of date. */
export function altitudeOfDateDeg(position: Equatorial, site: SiteLocation, date: Date): number {
  return Horizon(date, observerAt(site), position.raDeg / 15, position.decDeg).altitude;
}

/** Geometric altitude of a J2000 (ICRS) position (precession and nutation to date; no aberration, < 21″). */
export function altitudeDeg(position: Equatorial, site: SiteLocation, date: Date): number {
  return targetAltitudeDeg(position, site, date);
}

export function sunAltitudeDeg(site: SiteLocation, date: Date): number {
  return sunAltitudeAtDeg(site, date);
}

/** Topocentric apparent position of the Moon (true equator and equinox of date) and its distance. */
export function moonTopocentric(site: SiteLocation, date: Date): Equatorial & { distanceKm: number } {
  const moon = Equator(Body.Moon, date, observerAt(site), true, true);
  return { raDeg: moon.ra * 15, decDeg: moon.dec, distanceKm: moon.dist * AU_KM };
}

export function moonAltitudeDeg(site: SiteLocation, date: Date): number {
  return altitudeOfDateDeg(moonTopocentric(site, date), site, date);
}
