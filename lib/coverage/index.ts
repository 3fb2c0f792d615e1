/** Coverage of a sky map by observed footprints, and searched regions of positions: pure, no HTTP or SQL. */
export { computeCoverage, CoverageLog, endTime, timeToReach, type Coverage, type CoverageObservation, type CoveragePoint, type SiteCoverage } from "./curve";
export { OUTSIDE_LEVEL, searchedRegion, type SearchedRegion } from "./searched";
export { CoverageMask } from "./union";
export { CoverageLogCache } from "./log-cache";
