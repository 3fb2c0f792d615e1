/** Helpers that keep plotted arrays small for the candidate page (≤ MAX_PLOT_POINTS each). */

export const MAX_PLOT_POINTS = 200;

/** Evenly spaced indices 0 … n−1, at most `limit` of them, first and last included. */
export function decimatedIndices(count: number, limit: number = MAX_PLOT_POINTS): number[] {
  if (count <= 0) return [];
  if (count <= limit) return Array.from({ length: count }, (_, i) => i);
  const step = (count - 1) / (limit - 1);
  return Array.from({ length: limit }, (_, k) => Math.round(k * step));
}

/** Rounds to 6 significant digits so the JSON stays compact; non-finite values become 0 (callers filter them). */
export function compactNumber(value: number): number {
  return Number.isFinite(value) ? Number(value.toPrecision(6)) : 0;
}
