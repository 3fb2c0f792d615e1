/**
 * Greedy credible regions (common practice): rank pixels by probability density, highest first, and
 * take them until the enclosed probability reaches the level; the pixel that crosses it is included.
 * Ties in density are taken in index order, like a stable sort.
 *
 * Rather than sorting millions of pixels, the density threshold is located with histograms over the
 * shrinking density interval that holds it; only the few pixels in the final bin are sorted. The result
 * is the same set as a full sort, in O(n) passes.
 */

const BINS = 4096;
const SORT_BELOW = 256; // few enough to sort with a comparator

interface Histogram {
  lo: number;
  scale: number;
  prob: Float64Array;
  area: Float64Array;
  count: Uint32Array;
}

/**
 * Solid angles of the credible regions at several levels, in the units of `area` (a per-pixel array,
 * or one value for equal-area pixels). `probability` must be normalised; `density` ranks the pixels.
 */
export function credibleAreas(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  levels: readonly number[],
): number[] {
  let hi = 0;
  for (let i = 0; i < density.length; i++) {
    const d = density[i] ?? 0;
    if (d > hi) hi = d;
  }
  const all = { indices: null, lo: 0, hi };
  if (density.length <= SORT_BELOW || hi <= 0) {
    return levels.map((level) => takeSorted(density, probability, area, null, level));
  }
  const first = histogram(density, probability, area, null, 0, hi);
  return levels.map((level) => refine(density, probability, area, all, first, level));
}

/** Area of the single `level` credible region; see credibleAreas. */
export function credibleArea(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  level: number,
): number {
  return credibleAreas(density, probability, area, [level])[0] ?? 0;
}

function refine(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  start: { indices: Uint32Array | null; lo: number; hi: number },
  firstHistogram: Histogram,
  level: number,
): number {
  let { indices, lo, hi } = start;
  let hist: Histogram | null = firstHistogram;
  let takenProb = 0;
  let takenArea = 0;
  for (;;) {
    const count = indices ? indices.length : density.length;
    if (count <= SORT_BELOW || hi <= lo) {
      return takenArea + takeSorted(density, probability, area, indices, level - takenProb);
    }
    hist ??= histogram(density, probability, area, indices, lo, hi);
    let crossing = -1;
    for (let b = BINS - 1; b >= 0; b--) {
      const p = hist.prob[b] ?? 0;
      if (takenProb + p >= level) {
        crossing = b;
        break;
      }
      takenProb += p;
      takenArea += hist.area[b] ?? 0;
    }
    if (crossing < 0) return takenArea; // rounding left the total just short of the level: all pixels
    const next = new Uint32Array(hist.count[crossing] ?? 0);
    let n = 0;
    let nextLo = Infinity;
    let nextHi = -Infinity;
    const { lo: bottom, scale } = hist;
    for (let k = 0; k < count; k++) {
      const i = indices ? (indices[k] ?? 0) : k;
      const d = density[i] ?? 0;
      if (Math.min(BINS - 1, Math.floor((d - bottom) * scale)) !== crossing) continue;
      next[n++] = i;
      if (d < nextLo) nextLo = d;
      if (d > nextHi) nextHi = d;
    }
    indices = next;
    lo = nextLo;
    hi = nextHi;
    hist = null;
  }
}

function histogram(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  indices: Uint32Array | null,
  lo: number,
  hi: number,
): Histogram {
  const prob = new Float64Array(BINS);
  const areaBin = new Float64Array(BINS);
  const count = new Uint32Array(BINS);
  const scale = BINS / (hi - lo);
  const n = indices ? indices.length : density.length;
  for (let k = 0; k < n; k++) {
    const i = indices ? (indices[k] ?? 0) : k;
    const b = Math.min(BINS - 1, Math.floor(((density[i] ?? 0) - lo) * scale));
    prob[b] = (prob[b] ?? 0) + (probability[i] ?? 0);
    count[b] = (count[b] ?? 0) + 1;
    if (typeof area !== "number") areaBin[b] = (areaBin[b] ?? 0) + (area[i] ?? 0);
  }
  if (typeof area === "number") for (let b = 0; b < BINS; b++) areaBin[b] = (count[b] ?? 0) * area;
  return { lo, scale, prob, area: areaBin, count };
}

function takeSorted(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  indices: Uint32Array | null,
  remaining: number,
): number {
  const order = indices ? Array.from(indices) : Array.from({ length: density.length }, (_, i) => i);
  order.sort((a, b) => (density[b] ?? 0) - (density[a] ?? 0) || a - b);
  let prob = 0;
  let taken = 0;
  for (const i of order) {
    if (prob >= remaining) break;
    prob += probability[i] ?? 0;
    taken += typeof area === "number" ? area : (area[i] ?? 0);
  }
  return taken;
}

/**
 * Credible level of every pixel: the probability of all pixels ranked at or above it (greedy, common
 * practice), so the p contour is the boundary of {level ≤ p}. Sorts all pixels: meant for display grids.
 */
export function credibleLevels(density: Float64Array, probability: Float64Array): Float64Array {
  const order = Array.from({ length: density.length }, (_, i) => i);
  order.sort((a, b) => (density[b] ?? 0) - (density[a] ?? 0) || a - b);
  const levels = new Float64Array(density.length);
  let cumulative = 0;
  for (const i of order) {
    cumulative += probability[i] ?? 0;
    levels[i] = cumulative;
  }
  return levels;
}
