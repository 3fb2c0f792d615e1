/** Rounds to `digits` significant figures (a number, not a string). */
export function roundSignificant(value: number, digits: number): number {
  if (value === 0 || !Number.isFinite(value)) return value;
  // toPrecision is correctly rounded by the spec; scaling by 10 ** -k is not, and differed between server and browser.
  return Number(value.toPrecision(digits));
}

/** Plain decimal with comma grouping and no exponent, e.g. 33000 → "33,000", 1.5 → "1.5". */
export function groupedNumber(value: number, maxFractionDigits = 6): string {
  return value.toLocaleString("en-US", { maximumFractionDigits: maxFractionDigits, useGrouping: true });
}

/** A percentage for labels: "97 %", "0.4 %", "< 0.1 %". */
export function formatPercent(fraction: number): string {
  const pct = fraction * 100;
  if (pct > 0 && pct < 0.1) return "< 0.1 %";
  if (pct > 99.9 && pct < 100) return "> 99.9 %";
  return `${pct >= 10 || pct === 0 ? Math.round(pct) : pct.toFixed(1)} %`;
}
