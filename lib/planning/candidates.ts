import { POW4, ringToNest, pix2vec_nest, vecToRaDec } from "@/lib/skymap/healpix";
import { credibleDensityThreshold } from "@/lib/skymap/region-threshold";
import type { Footprint } from "@/lib/skymap/footprint";
import type { SkymapMap, SkyPosition } from "@/lib/skymap/types";

/** Finest candidate grid used (HEALPix order 10, cells of about 3.4′). */
export const MAX_GRID_ORDER = 10;

/** The smaller side of a footprint, in degrees (a circle: the side of its inscribed square, r·√2). */
export function footprintSideDeg(footprint: Footprint): number {
  return footprint.shape === "rectangle" ? Math.min(footprint.widthDeg, footprint.heightDeg) : footprint.radiusDeg * Math.SQRT2;
}

/**
 * Order of the candidate grid: the coarsest HEALPix grid whose cells (side √(4π / 12·4^order)) are at most half
 * the footprint's smaller side, so neighbouring candidates overlap by at least half a footprint.
 */
export function candidateGridOrder(footprint: Footprint): number {
  const halfSideRad = (footprintSideDeg(footprint) * Math.PI) / 360;
  for (let order = 0; order < MAX_GRID_ORDER; order++) {
    if (Math.sqrt(Math.PI / (3 * (POW4[order] ?? 1))) <= halfSideRad) return order;
  }
  return MAX_GRID_ORDER;
}

/**
 * Candidate centres: the centres of the grid cells (NESTED, at candidateGridOrder) that hold the centre of any
 * pixel of the `level` credible region, or lie inside one coarser than the grid. Sorted by cell index.
 */
export function candidateCentres(map: SkymapMap, footprint: Footprint, level: number): SkyPosition[] {
  const grid = candidateGridOrder(footprint);
  const threshold = credibleDensityThreshold(map, level);
  const cells = new Set<number>();
  const add = (order: number, nest: number) => {
    if (order >= grid) cells.add(Math.floor(nest / (POW4[order - grid] ?? 1)));
    else {
      const span = POW4[grid - order] ?? 1;
      for (let k = 0; k < span; k++) cells.add(nest * span + k);
    }
  };
  if (map.layout === "multiorder") {
    for (let i = 0; i < map.order.length; i++) {
      if ((map.densityPerSr[i] ?? 0) >= threshold && (map.probability[i] ?? 0) > 0) add(map.order[i] ?? 0, map.ipix[i] ?? 0);
    }
  } else {
    const ring = map.layout === "flat-ring";
    for (let i = 0; i < map.probability.length; i++) {
      const p = map.probability[i] ?? 0;
      if (p >= threshold && p > 0) add(map.order, ring ? ringToNest(map.nside, i) : i);
    }
  }
  const nside = 2 ** grid;
  return [...cells].sort((a, b) => a - b).map((cell) => vecToRaDec(pix2vec_nest(nside, cell)));
}
