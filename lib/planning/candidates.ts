import { POW4, ringToNest, pix2vec_nest, vecToRaDec } from "@/lib/skymap/healpix";
import { credibleRegionPixels } from "@/lib/skymap/region-threshold";
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
  // cell indices as found (neighbouring NESTED pixels share a cell, so repeats in a row are dropped at once),
  // then sorted and made unique: no hash set over the region's pixels
  let cells = new Float64Array(1024);
  let count = 0;
  const push = (cell: number) => {
    if (count > 0 && cells[count - 1] === cell) return;
    if (count === cells.length) {
      const next = new Float64Array(2 * cells.length);
      next.set(cells);
      cells = next;
    }
    cells[count++] = cell;
  };
  const add = (order: number, nest: number) => {
    if (order >= grid) push(Math.floor(nest / (POW4[order - grid] ?? 1)));
    else {
      const span = POW4[grid - order] ?? 1;
      for (let k = 0; k < span; k++) push(nest * span + k);
    }
  };
  const region = credibleRegionPixels(map, level);
  if (map.layout === "multiorder") {
    const { order, ipix } = map;
    for (let k = 0; k < region.length; k++) {
      const i = region[k] ?? 0;
      add(order[i] ?? 0, ipix[i] ?? 0);
    }
  } else {
    const ring = map.layout === "flat-ring";
    for (let k = 0; k < region.length; k++) {
      const i = region[k] ?? 0;
      add(map.order, ring ? ringToNest(map.nside, i) : i);
    }
  }
  const sorted = cells.subarray(0, count).sort();
  const nside = 2 ** grid;
  const centres: SkyPosition[] = [];
  for (let k = 0; k < sorted.length; k++) {
    const cell = sorted[k] ?? 0;
    if (k > 0 && sorted[k - 1] === cell) continue;
    centres.push(vecToRaDec(pix2vec_nest(nside, cell)));
  }
  return centres;
}
