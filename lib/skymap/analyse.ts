import { credibleAreas } from "./credible";
import { mapDistance, pixelDistance } from "./distance";
import { SkymapError } from "./errors";
import type { ReadFitsOptions } from "./fits";
import { nestCentreVec, pix2vec_nest, pix2vec_ring, pixelAreaSr, SR_TO_DEG2, vecToRaDec } from "./healpix";
import { loadSkymap } from "./load";
import type { DistanceSummary, SkymapMap, SkymapSummary, SkyPosition } from "./types";

export type AnalyseResult =
  | { ok: true; summary: SkymapSummary; map: SkymapMap }
  | { ok: false; error: SkymapError };

/**
 * Reads, validates and summarises a HEALPix sky map (FITS, optionally gzip'd): total probability,
 * 50 % / 90 % greedy credible areas and the position of highest density. Bad input comes back as
 * `{ ok: false, error }`; the returned map answers coneProbability and toDisplayGrid.
 */
export function analyseSkymap(bytes: Uint8Array, options: ReadFitsOptions = {}): AnalyseResult {
  try {
    const { map, totalProbability, normalised, warnings } = loadSkymap(bytes, options);
    const [area50Deg2 = 0, area90Deg2 = 0] = credibleAreasDeg2(map, [0.5, 0.9]);
    const summary: SkymapSummary = {
      totalProbability,
      normalised,
      warnings,
      area50Deg2,
      area90Deg2,
      peak: peakPosition(map),
      layout: map.layout,
      ...(map.layout === "multiorder" ? { maxOrder: map.maxOrder } : { nside: map.nside }),
      pixelCount: map.probability.length,
    };
    const distance = distanceSummary(map);
    if (distance) summary.distance = distance;
    return { ok: true, summary, map };
  } catch (error) {
    if (error instanceof SkymapError) return { ok: false, error };
    throw error;
  }
}

/** Areas of the greedy credible regions at the given levels (e.g. [0.5, 0.9]), in square degrees. */
export function credibleAreasDeg2(map: SkymapMap, levels: readonly number[]): number[] {
  if (map.layout === "multiorder") {
    const area = new Float64Array(map.order.length);
    for (let i = 0; i < area.length; i++) area[i] = pixelAreaSr(map.order[i] ?? 0);
    return credibleAreas(map.densityPerSr, map.probability, area, levels).map((sr) => sr * SR_TO_DEG2);
  }
  // equal-area pixels: probability ranks them as density would
  return credibleAreas(map.probability, map.probability, pixelAreaSr(map.order), levels).map((sr) => sr * SR_TO_DEG2);
}

/** Area of the greedy credible region at one level, in square degrees. */
export function credibleAreaDeg2(map: SkymapMap, level: number): number {
  return credibleAreasDeg2(map, [level])[0] ?? 0;
}

/** Whole-map and most-probable-pixel distances of a 3D map; undefined without distance columns. */
export function distanceSummary(map: SkymapMap): DistanceSummary | undefined {
  if (!map.distance) return undefined;
  const whole = mapDistance(map.probability, map.distance);
  if (!whole) return undefined;
  return { meanMpc: whole.meanMpc, stdMpc: whole.stdMpc, atPeak: pixelDistance(map.distance, peakIndex(map)), coveredProbability: whole.coveredProbability };
}

/** Index of the highest-density pixel (the first one on ties). */
export function peakIndex(map: SkymapMap): number {
  const ranked = map.layout === "multiorder" ? map.densityPerSr : map.probability;
  let best = 0;
  for (let i = 1; i < ranked.length; i++) if ((ranked[i] ?? 0) > (ranked[best] ?? 0)) best = i;
  return best;
}

/** Centre of the highest-density pixel (the first one on ties). */
export function peakPosition(map: SkymapMap): SkyPosition {
  const best = peakIndex(map);
  if (map.layout === "multiorder") return vecToRaDec(nestCentreVec(map.order[best] ?? 0, map.ipix[best] ?? 0));
  const vec = map.layout === "flat-ring" ? pix2vec_ring(map.nside, best) : pix2vec_nest(map.nside, best);
  return vecToRaDec(vec);
}
