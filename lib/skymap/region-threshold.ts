import type { SkymapMap } from "./types";

const BINS = 4096;

/**
 * A density threshold t such that the pixels with density ≥ t hold at least `level` of the probability: the
 * greedy credible region (common practice) up to a sliver. Two passes of a 4096-bin histogram of density (the
 * second inside the bin that crosses the level) instead of sorting millions of pixels, so the region may hold
 * a few pixels of that last bin beyond the exact greedy set (never fewer).
 * Flat maps rank by probability (equal-area pixels), multi-order maps by density per steradian.
 */
export function credibleDensityThreshold(map: SkymapMap, level: number): number {
  // maps are never changed after loading, so the threshold is kept per map object and level (several plans,
  // one per instrument, are made on the same cached map)
  let byLevel = memo.get(map);
  if (!byLevel) {
    byLevel = new Map();
    memo.set(map, byLevel);
  }
  const known = byLevel.get(level);
  if (known !== undefined) return known;
  const threshold = computeThreshold(map, level);
  byLevel.set(level, threshold);
  return threshold;
}

const memo = new WeakMap<SkymapMap, Map<number, number>>();

function computeThreshold(map: SkymapMap, level: number): number {
  const density = map.layout === "multiorder" ? map.densityPerSr : map.probability;
  const { probability } = map;
  const n = density.length;
  let hi = 0;
  for (let i = 0; i < n; i++) {
    const d = density[i] ?? 0;
    if (d > hi) hi = d;
  }
  if (!(hi > 0)) return 0;
  let lo = 0;
  let topOpen = false; // after the first pass the top edge belongs to bins already taken
  let taken = 0;
  for (let pass = 0; pass < 2; pass++) {
    const prob = new Float64Array(BINS);
    const scale = BINS / (hi - lo);
    if (lo === 0 && !topOpen) {
      // first pass: every positive density is in range (hi is the maximum) and d − 0 = d
      for (let i = 0; i < n; i++) {
        const d = density[i] ?? 0;
        if (!(d > 0)) continue;
        const b = Math.min(BINS - 1, Math.floor(d * scale));
        prob[b] = (prob[b] ?? 0) + (probability[i] ?? 0);
      }
    } else {
      for (let i = 0; i < n; i++) {
        const d = density[i] ?? 0;
        if (d < lo || !(d > 0) || d > hi || (topOpen && d === hi)) continue;
        const b = Math.min(BINS - 1, Math.floor((d - lo) * scale));
        prob[b] = (prob[b] ?? 0) + (probability[i] ?? 0);
      }
    }
    let crossing = -1;
    for (let b = BINS - 1; b >= 0; b--) {
      const p = prob[b] ?? 0;
      if (taken + p >= level) {
        crossing = b;
        break;
      }
      taken += p;
    }
    if (crossing < 0) return Number.MIN_VALUE; // rounding left the total short of the level: every pixel with probability
    const width = (hi - lo) / BINS;
    const bottom = lo + crossing * width;
    if (crossing < BINS - 1) {
      hi = bottom + width;
      topOpen = true;
    }
    lo = bottom;
  }
  // a hair below the bin's edge so rounding in the bin arithmetic never drops a pixel of the region
  return lo * (1 - 1e-9);
}

const regionMemo = new WeakMap<SkymapMap, Map<number, Uint32Array>>();

/**
 * Indices (into the map's arrays, ascending) of the pixels of the `level` region: density at or above
 * credibleDensityThreshold and probability above 0. Kept per map object and level like the threshold, so plans
 * after the first on a map walk the region's pixels instead of the whole map.
 */
export function credibleRegionPixels(map: SkymapMap, level: number): Uint32Array {
  let byLevel = regionMemo.get(map);
  if (!byLevel) {
    byLevel = new Map();
    regionMemo.set(map, byLevel);
  }
  const known = byLevel.get(level);
  if (known) return known;
  const threshold = credibleDensityThreshold(map, level);
  const density = map.layout === "multiorder" ? map.densityPerSr : map.probability;
  const { probability } = map;
  let count = 0;
  for (let i = 0; i < density.length; i++) if ((density[i] ?? 0) >= threshold && (probability[i] ?? 0) > 0) count++;
  const pixels = new Uint32Array(count);
  let k = 0;
  for (let i = 0; i < density.length; i++) if ((density[i] ?? 0) >= threshold && (probability[i] ?? 0) > 0) pixels[k++] = i;
  byLevel.set(level, pixels);
  return pixels;
}
