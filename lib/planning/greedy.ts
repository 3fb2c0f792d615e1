import { placeFootprint, type Footprint } from "@/lib/skymap/footprint";
import { footprintPixelIndices } from "@/lib/skymap/footprint-pixels";
import { FootprintSearch } from "@/lib/skymap/footprint-search";
import { newIndexList } from "@/lib/skymap/index-list";
import type { SkymapMap, SkyPosition } from "@/lib/skymap/types";
import { candidateCentres, candidateGridOrder } from "./candidates";
import { MaxHeap } from "./heap";

export interface PlacedTile extends SkyPosition {
  footprint: Footprint;
}

export interface GreedyOptions {
  /** Credible level to reach (0.5–0.99). */
  level: number;
  /** Upper bound on the number of pointings (1–500). */
  maxPointings: number;
  /** Footprints of other plans (or observations) whose probability must not count again. */
  avoid?: readonly PlacedTile[];
}

export interface GreedyPointing extends SkyPosition {
  /** Probability inside this footprint alone. */
  probability: number;
  /** Probability it adds to the earlier pointings and the avoided footprints (no double counting). */
  gainedProbability: number;
  /** Sum of gainedProbability up to and including this pointing. */
  cumulativeProbability: number;
  /** Pixel indices (into the map's arrays) inside the footprint; used for the scheduled union. */
  pixels: Uint32Array;
}

export interface GreedyPlan {
  pointings: GreedyPointing[];
  /** Probability of the union of the plan's footprints (avoided sky included where a footprint covers it). */
  totalProbability: number;
  /** Probability already inside the avoided footprints. */
  avoidedProbability: number;
  candidateCount: number;
}

/**
 * Greedy maximum coverage (Nemhauser, Wolsey & Fisher 1978: within 1 − 1/e of the best choice of as many
 * footprints): each step takes the candidate centre whose footprint adds the most probability not yet covered by
 * earlier pointings or by `avoid`. Coverage is submodular, so a candidate's gain can only shrink; gains are kept
 * as upper bounds in a heap and recomputed only when a candidate reaches the top ("lazy greedy", Minoux 1978),
 * which picks the same centres as recomputing every gain each step. Ties go to the lower candidate index.
 * Stops at maxPointings, when the plan and the avoided sky together hold `level`, or when nothing adds probability.
 */
export function greedyPlan(map: SkymapMap, footprint: Footprint, options: GreedyOptions): GreedyPlan {
  const { probability } = map;
  const covered = new Uint8Array(probability.length);
  let avoidedProbability = 0;
  for (const tile of options.avoid ?? []) {
    for (const i of footprintPixelIndices(map, placeFootprint(tile.footprint, tile.raDeg, tile.decDeg))) {
      if (covered[i]) continue;
      covered[i] = 1;
      avoidedProbability += probability[i] ?? 0;
    }
  }
  const centres = candidateCentres(map, footprint, options.level);
  // every candidate's pixels in one array (candidate k: pool[first[k]] … pool[first[k + 1] − 1]); the search
  // buckets pixels by the candidate grid's cells (a quarter to a half of the footprint's side)
  const search = new FootprintSearch(map, candidateGridOrder(footprint));
  const list = newIndexList(1 << 16);
  const first = new Float64Array(centres.length + 1);
  for (let k = 0; k < centres.length; k++) {
    const c = centres[k] ?? { raDeg: 0, decDeg: 0 };
    search.collect(placeFootprint(footprint, c.raDeg, c.decDeg), list);
    first[k + 1] = list.length;
  }
  const pool = list.values;
  const gainOf = (k: number) => {
    const end = first[k + 1] ?? 0;
    let sum = 0;
    for (let n = first[k] ?? 0; n < end; n++) {
      const i = pool[n] ?? 0;
      if (!covered[i]) sum += probability[i] ?? 0;
    }
    return sum;
  };
  const heap = new MaxHeap(centres.length);
  for (let k = 0; k < centres.length; k++) heap.push(k, gainOf(k));

  const pointings: GreedyPointing[] = [];
  let reached = avoidedProbability;
  let cumulative = 0;
  while (pointings.length < options.maxPointings && reached < options.level) {
    const best = takeBest(heap, gainOf);
    if (!best || !(best.gain > 0)) break;
    const pixels = pool.slice(first[best.index] ?? 0, first[best.index + 1] ?? 0);
    let own = 0;
    for (let n = 0; n < pixels.length; n++) {
      const i = pixels[n] ?? 0;
      own += probability[i] ?? 0;
      covered[i] = 1;
    }
    cumulative += best.gain;
    reached += best.gain;
    const centre = centres[best.index] ?? { raDeg: 0, decDeg: 0 };
    pointings.push({ ...centre, probability: own, gainedProbability: best.gain, cumulativeProbability: cumulative, pixels });
  }
  return { pointings, totalProbability: unionProbability(probability, pointings), avoidedProbability, candidateCount: centres.length };
}

/** Lazy greedy: pop, recompute; if it still beats the next bound (ties: lower index) it is the true best. */
function takeBest(heap: MaxHeap, gainOf: (k: number) => number): { index: number; gain: number } | null {
  for (;;) {
    const top = heap.pop();
    if (!top) return null;
    const gain = gainOf(top.index);
    const next = heap.peek();
    if (!next || gain > next.key || (gain === next.key && top.index < next.index)) return { index: top.index, gain };
    heap.push(top.index, gain);
  }
}

/** Probability of the union of the given pointings' pixels. */
export function unionProbability(probability: Float64Array, pointings: ReadonlyArray<{ pixels: Uint32Array }>): number {
  const seen = new Uint8Array(probability.length);
  let sum = 0;
  for (const p of pointings) {
    const { pixels } = p;
    for (let n = 0; n < pixels.length; n++) {
      const i = pixels[n] ?? 0;
      if (seen[i]) continue;
      seen[i] = 1;
      sum += probability[i] ?? 0;
    }
  }
  return sum;
}
