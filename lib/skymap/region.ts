import { degradeDisplayGrid, type DisplayGrid, toDisplayGrid } from "./display-grid";
import { pix2vec_nest, vecToRaDec } from "./healpix";
import type { RegionPoint, SkymapMap } from "./types";

export interface RegionPointsOptions {
  /** Credible level of the region; 0.9 by default. */
  level?: number;
  /** Upper bound on the number of points; the grid is coarsened until the region fits. */
  maxPoints?: number;
  /** Finest grid tried (power of two ≤ 256); 64 by default (pixels of about 0.92°). */
  nside?: number;
}

/**
 * Pixel centres (and their probabilities) of the greedy `level` credible region on the finest grid that
 * keeps the list within maxPoints, for visibility calculations. Accepts a native map or a display grid.
 */
export function credibleRegionPoints(source: SkymapMap | DisplayGrid, options: RegionPointsOptions = {}): RegionPoint[] {
  const level = options.level ?? 0.9;
  const maxPoints = options.maxPoints ?? 4096;
  let grid = "credibleLevel" in source ? source : toDisplayGrid(source, options.nside ?? 64);
  for (;;) {
    const inside = regionPixels(grid, level);
    if (inside.length <= maxPoints || grid.nside === 1) {
      return inside.map((nest) => ({ ...vecToRaDec(pix2vec_nest(grid.nside, nest)), prob: grid.probability[nest] ?? 0 }));
    }
    grid = degradeDisplayGrid(grid, grid.nside / 2);
  }
}

/** Pixels ranked before the level is reached, the crossing pixel included (as for the areas). */
function regionPixels(grid: DisplayGrid, level: number): number[] {
  const inside: number[] = [];
  for (let i = 0; i < grid.probability.length; i++) {
    if ((grid.credibleLevel[i] ?? 1) - (grid.probability[i] ?? 0) < level) inside.push(i);
  }
  return inside;
}
