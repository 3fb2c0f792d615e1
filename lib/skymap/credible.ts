/**
 * Greedy credible regions (common practice): rank pixels by probability density, highest first, and
 * take them until the enclosed probability reaches the level; the pixel that crosses it is included.
 * Ties in density are taken in index order, like a stable sort.
 *
 * Rather than sorting millions of pixels, the density threshold is located with histograms over the
 * shrinking density interval that holds it; only the few pixels in the final bin are sorted. The result
 * is the same set as a full sort.
 */

const BINS = 4096;
const SORT_BELOW = 4096;

/**
 * Solid angle of the `level` credible region, in the units of `area` (a per-pixel array or one value
 * for equal-area pixels). `probability` must be normalised; `density` ranks the pixels.
 */
export function credibleArea(
  density: Float64Array,
  probability: Float64Array,
  area: Float64Array | number,
  level: number,
): number {
  const areas = typeof area === "number" ? null : area;
  const unitArea = typeof area === "number" ? area : 0;
  const areaOf = (i: number) => (areas ? (areas[i] ?? 0) : unitArea);
  let lo = 0;
  let hi = 0;
  for (let i = 0; i < density.length; i++) if ((density[i] ?? 0) > hi) hi = density[i] ?? 0;
  let candidates: Uint32Array | null = null; // null: every pixel
  let takenProb = 0;
  let takenArea = 0;

  for (;;) {
    const count = candidates ? candidates.length : density.length;
    if (count <= SORT_BELOW || hi <= lo) {
      return takenArea + takeSorted(density, probability, areaOf, candidates, level - takenProb);
    }
    const probBin = new Float64Array(BINS);
    const areaBin = new Float64Array(BINS);
    const countBin = new Uint32Array(BINS);
    const scale = BINS / (hi - lo);
    const bottom = lo;
    const binOf = (d: number) => Math.min(BINS - 1, Math.floor((d - bottom) * scale));
    for (let k = 0; k < count; k++) {
      const i = candidates ? (candidates[k] ?? 0) : k;
      const b = binOf(density[i] ?? 0);
      probBin[b] = (probBin[b] ?? 0) + (probability[i] ?? 0);
      countBin[b] = (countBin[b] ?? 0) + 1;
      if (areas) areaBin[b] = (areaBin[b] ?? 0) + (areas[i] ?? 0);
    }
    if (!areas) for (let b = 0; b < BINS; b++) areaBin[b] = (countBin[b] ?? 0) * unitArea;
    let crossing = -1;
    for (let b = BINS - 1; b >= 0; b--) {
      if (takenProb + (probBin[b] ?? 0) >= level) {
        crossing = b;
        break;
      }
      takenProb += probBin[b] ?? 0;
      takenArea += areaBin[b] ?? 0;
    }
    if (crossing < 0) return takenArea; // rounding left the total just short of the level: all pixels

    const next = new Uint32Array(countBin[crossing] ?? 0);
    let n = 0;
    let nextLo = Infinity;
    let nextHi = -Infinity;
    for (let k = 0; k < count; k++) {
      const i = candidates ? (candidates[k] ?? 0) : k;
      const d = density[i] ?? 0;
      if (binOf(d) !== crossing) continue;
      next[n++] = i;
      if (d < nextLo) nextLo = d;
      if (d > nextHi) nextHi = d;
    }
    candidates = next;
    lo = nextLo;
    hi = nextHi;
  }
}

function takeSorted(
  density: Float64Array,
  probability: Float64Array,
  areaOf: (i: number) => number,
  candidates: Uint32Array | null,
  remaining: number,
): number {
  const order = candidates ? Array.from(candidates) : Array.from({ length: density.length }, (_, i) => i);
  order.sort((a, b) => (density[b] ?? 0) - (density[a] ?? 0) || a - b);
  let prob = 0;
  let area = 0;
  for (const i of order) {
    if (prob >= remaining) break;
    prob += probability[i] ?? 0;
    area += areaOf(i);
  }
  return area;
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
