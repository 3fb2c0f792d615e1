import { pixelAreaSr, SR_TO_DEG2 } from "@/lib/skymap/healpix";
import { pixelLocator } from "@/lib/skymap/pixel-at";
import type { SkymapMap } from "@/lib/skymap/types";

export interface SearchedRegion {
  /** Probability of every pixel at least as dense as the one holding the position: the smallest greedy credible region containing it. */
  searchedProbability: number;
  /** That region's solid angle. */
  searchedAreaDeg2: number;
  /** Probability density at the position (of its pixel), per square degree. */
  probabilityDensityPerDeg2: number;
}

/** Above this searched probability a position lies outside the 99.9 % credible region. */
export const OUTSIDE_LEVEL = 0.999;

/**
 * Searched probability and area of a position (common practice in the follow-up literature, e.g. Singer et al.
 * 2014, ApJ 795, 105, §4): rank pixels by density and take every pixel at least as dense as the one holding
 * the position. A position a multi-order map has no pixel for counts as density 0 (the whole sky is searched).
 */
export function searchedRegion(map: SkymapMap, raDeg: number, decDeg: number): SearchedRegion {
  const index = pixelLocator(map)(raDeg, decDeg);
  const count = map.probability.length;
  const areaOf = (i: number) => (map.layout === "multiorder" ? pixelAreaSr(map.order[i] ?? 0) : pixelAreaSr(map.order));
  // equal-area pixels: probability ranks them as density does, without a division that could merge near-ties
  const rank = map.layout === "multiorder" ? map.densityPerSr : map.probability;
  const threshold = index >= 0 ? (rank[index] ?? 0) : 0;
  let probability = 0;
  let areaSr = 0;
  for (let i = 0; i < count; i++) {
    if ((rank[i] ?? 0) < threshold) continue;
    probability += map.probability[i] ?? 0;
    areaSr += areaOf(i);
  }
  return {
    searchedProbability: Math.min(1, probability),
    searchedAreaDeg2: areaSr * SR_TO_DEG2,
    probabilityDensityPerDeg2: (map.layout === "multiorder" ? threshold : threshold / areaOf(0)) / SR_TO_DEG2,
  };
}
