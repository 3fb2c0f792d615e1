/**
 * Sample quantile by Hyndman & Fan (1996), "Sample Quantiles in Statistical Packages", The American
 * Statistician 50(4):361–365, definition 7 (linear interpolation between order statistics; the default of R's
 * quantile() and numpy.percentile): with the sample sorted ascending as x[1..n] and h = (n − 1)p + 1,
 * Q(p) = x[⌊h⌋] + (h − ⌊h⌋)(x[⌊h⌋ + 1] − x[⌊h⌋]). Returns null for an empty sample.
 */
export function quantileType7(sortedAscending: ArrayLike<number>, p: number): number | null {
  const n = sortedAscending.length;
  if (n === 0) return null;
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile probability must be within [0, 1], got ${p}`);
  const h = (n - 1) * p; // zero-based form of (n − 1)p + 1
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  const below = sortedAscending[lo] as number;
  const above = sortedAscending[hi] as number;
  return below + (h - lo) * (above - below);
}

/** Sorts a copy numerically (Array.prototype.sort alone compares as strings). */
export function sortedCopy(values: readonly number[]): number[] {
  return [...values].sort((a, b) => a - b);
}
