/** Public surface of the sky-map library: pure functions over bytes and typed arrays. */
export { analyseSkymap, credibleAreaDeg2, credibleAreasDeg2, distanceSummary, peakPosition, type AnalyseResult } from "./analyse";
export { SkymapCache } from "./cache";
export { coneProbability } from "./cone";
export {
  ansatzMoments,
  ansatzNorm,
  hasAnsatz,
  mapDistance,
  normalDensityPerMpc,
  pixelDistance,
  type DistanceLayers,
  type DistanceMoments,
} from "./distance";
export {
  decodeDisplayGrid,
  degradeDisplayGrid,
  displayGridToMap,
  encodeDisplayGrid,
  MAX_DISPLAY_NSIDE,
  toDisplayGrid,
  type DisplayGrid,
} from "./display-grid";
export { SkymapError, type SkymapErrorCode } from "./errors";
export { DEFAULT_MAX_FITS_BYTES } from "./fits";
export { footprintOutline, localEastNorth, placeFootprint, type Footprint, type PlacedFootprint } from "./footprint";
export { footprintPixels, footprintProbability } from "./footprint-pixels";
export { loadSkymap, type LoadedSkymap } from "./load";
export { pixelLocator, type PixelLocator } from "./pixel-at";
export { credibleRegionPoints, type RegionPointsOptions } from "./region";
export type * from "./types";
