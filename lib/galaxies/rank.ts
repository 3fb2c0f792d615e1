import { GALAXY_CELL_ORDER } from "@/db/schema/galaxies";
import { hasAnsatz } from "@/lib/skymap/distance";
import { pixelAreaSr, POW4, ringToNest } from "@/lib/skymap/healpix";
import { fineIndexLocator } from "@/lib/skymap/pixel-at";
import { credibleDensityThreshold } from "@/lib/skymap/region-threshold";
import type { SkymapMap } from "@/lib/skymap/types";
import type { GalaxyColumns } from "./pack";

/**
 * Galaxy ranking in a 3D sky map (pure). The score of a galaxy at distance r in pixel n is
 * ρ(n) · DISTNORM(n) · N(r; DISTMU(n), DISTSIGMA(n)) · weight: the posterior probability per unit volume of the
 * Singer et al. 2016 ansatz (ApJL 829 L15, eq. 1 divided by r²; ApJS 226 10, §3) times a luminosity or mass proxy,
 * with ρ the probability per steradian of the pixel. A pixel without distance information scores 0.
 */

export interface RankedGalaxy {
  /** the galaxy's id in the catalogue (its row in `galaxies`) */
  id: number;
  distanceMpc: number;
  weight: number;
  score: number;
  /** score over the sum of the scores of every galaxy considered */
  normalizedScore: number;
  /** normalizedScore summed down the list, this galaxy included */
  cumulativeScore: number;
}

export interface Ranking {
  /** galaxies inside the credible region (the ones scored and summed) */
  considered: number;
  totalScore: number;
  galaxies: RankedGalaxy[];
}

/**
 * The catalogue's index cells (NESTED at GALAXY_CELL_ORDER) that touch the greedy credible region at `level`:
 * each region pixel gives the cell holding it (finer pixels) or every cell inside it (coarser pixels).
 */
export function regionCells(map: SkymapMap, level: number, threshold = credibleDensityThreshold(map, level)): number[] {
  const density = map.layout === "multiorder" ? map.densityPerSr : map.probability;
  const cells = new Uint8Array(12 * POW4[GALAXY_CELL_ORDER]!);
  for (let i = 0; i < density.length; i++) {
    if (!((density[i] ?? 0) >= threshold) || !((map.probability[i] ?? 0) > 0)) continue;
    let order: number;
    let nested: number;
    if (map.layout === "multiorder") {
      order = map.order[i] ?? 0;
      nested = map.ipix[i] ?? 0;
    } else {
      order = map.order;
      nested = map.layout === "flat-ring" ? ringToNest(map.nside, i) : i;
    }
    if (order >= GALAXY_CELL_ORDER) cells[Math.floor(nested / POW4[order - GALAXY_CELL_ORDER]!)] = 1;
    else {
      const span = POW4[GALAXY_CELL_ORDER - order]!;
      cells.fill(1, nested * span, (nested + 1) * span);
    }
  }
  const out: number[] = [];
  for (let c = 0; c < cells.length; c++) if (cells[c]) out.push(c);
  return out;
}

export interface ScoreOptions {
  /** only galaxies in pixels of the greedy credible region at this level are scored (others get −1); none: all */
  level?: number;
  /** credibleDensityThreshold(map, level), when the caller has it already */
  threshold?: number;
}

/** The score of each galaxy (see the top of the file), or −1 for one outside the region. The map must be 3D. */
export function galaxyScores(map: SkymapMap, galaxies: GalaxyColumns, options: ScoreOptions = {}): Float64Array {
  const layers = map.distance;
  if (!layers) throw new Error("galaxyScores needs a map with distance columns");
  // ρ per steradian: multi-order maps carry it; flat maps are probability over the one pixel area
  const multi = map.layout === "multiorder";
  const rank = multi ? map.densityPerSr : map.probability;
  const perSr = multi ? 1 : 1 / pixelAreaSr(map.order);
  const threshold = options.threshold ?? (options.level === undefined ? -Infinity : credibleDensityThreshold(map, options.level));
  const locate = fineIndexLocator(map);
  const { fine, distanceMpc, weight } = galaxies;
  const out = new Float64Array(galaxies.count);
  const invSqrt2Pi = 1 / Math.sqrt(2 * Math.PI);
  for (let k = 0; k < galaxies.count; k++) {
    const i = locate(fine[k] ?? 0);
    if (i < 0 || !((rank[i] ?? 0) >= threshold)) {
      out[k] = -1;
      continue;
    }
    const mu = layers.muMpc[i] ?? Infinity;
    const sigma = layers.sigmaMpc[i] ?? 0;
    const norm = layers.normPerMpc2[i] ?? 0;
    if (!hasAnsatz(mu, sigma, norm)) continue;
    const u = ((distanceMpc[k] ?? 0) - mu) / sigma;
    out[k] = (rank[i] ?? 0) * perSr * norm * (Math.exp(-0.5 * u * u) * invSqrt2Pi / sigma) * (weight[k] ?? 0);
  }
  return out;
}

/**
 * The `limit` best galaxies of those inside the credible region, by score (ties: column order), with their
 * share of the summed score and the running total of those shares.
 */
export function rankGalaxies(map: SkymapMap, galaxies: GalaxyColumns, options: { level: number; limit: number; threshold?: number }): Ranking {
  const scores = galaxyScores(map, galaxies, options);
  let considered = 0;
  let total = 0;
  for (const s of scores) {
    if (s < 0) continue;
    considered += 1;
    total += s;
  }
  const top = topIndices(scores, options.limit);
  let running = 0;
  const ranked = top.map((k) => {
    const score = scores[k] ?? 0;
    const normalizedScore = total > 0 ? score / total : 0;
    running += normalizedScore;
    const { id, distanceMpc, weight } = galaxies;
    return { id: id[k] ?? 0, distanceMpc: distanceMpc[k] ?? 0, weight: weight[k] ?? 0, score, normalizedScore, cumulativeScore: Math.min(1, running) };
  });
  return { considered, totalScore: total, galaxies: ranked };
}

/** Indices of the `limit` highest non-negative scores, best first (ties: lower index first); a min-heap of size limit. */
export function topIndices(scores: Float64Array, limit: number): number[] {
  const heap: number[] = [];
  const worse = (a: number, b: number) => (scores[a] ?? 0) < (scores[b] ?? 0) || ((scores[a] ?? 0) === (scores[b] ?? 0) && a > b);
  const down = (i: number) => {
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < heap.length && worse(heap[l]!, heap[m]!)) m = l;
      if (r < heap.length && worse(heap[r]!, heap[m]!)) m = r;
      if (m === i) return;
      [heap[i], heap[m]] = [heap[m]!, heap[i]!];
      i = m;
    }
  };
  for (let k = 0; k < scores.length && limit > 0; k++) {
    if (!((scores[k] ?? -1) >= 0)) continue;
    if (heap.length < limit) {
      heap.push(k);
      for (let i = heap.length - 1; i > 0; ) {
        const p = (i - 1) >> 1;
        if (!worse(heap[i]!, heap[p]!)) break;
        [heap[i], heap[p]] = [heap[p]!, heap[i]!];
        i = p;
      }
    } else if (worse(heap[0]!, k)) {
      heap[0] = k;
      down(0);
    }
  }
  return heap.sort((a, b) => (scores[b] ?? 0) - (scores[a] ?? 0) || a - b);
}
