/** Public surface of lib/astro (on astronomy-engine): Sun, Moon, sidereal time, altitudes, nights, site visibility. */
export { airmassToAltitudeDeg, angularSeparationDeg, j2000ToOfDate, type Equatorial } from "./coords";
export { moonApparent, moonIlluminatedFraction, moonPositionJ2000, type MoonPosition } from "./moon";
export { comingNight, findCrossings, type Crossing, type Night, type NightOptions } from "./night";
export {
  altitudeDeg,
  altitudeOfDateDeg,
  moonAltitudeDeg,
  moonTopocentric,
  sunAltitudeDeg,
  type Site,
  type SiteLocation,
} from "./site";
export { sunApparent, sunPositionJ2000, type SunPosition } from "./sun";
export { dateFromJulianDay, greenwichSiderealTimeDeg, julianDay, localSiderealTimeDeg } from "./time";
export {
  siteVisibility,
  type ObservingWindow,
  type SiteVisibility,
  type SiteVisibilityInput,
  type WeightedPosition,
} from "./visibility";
export {
  airmassAtAltitude,
  ASTRONOMICAL_NIGHT_SUN_DEG,
  astronomicalNights,
  DEFAULT_MOON_DISTANCE_DEG,
  intersectIntervals,
  intervalsAboveAltitude,
  moonSeparationDeg,
  sunAltitudeAtDeg,
  targetAltitudeAndAirmass,
  targetAltitudeDeg,
  type IntervalOptions,
  type TimeInterval,
} from "./schedule";
