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

/**
 * A no-break space: joins a number to its unit (and a clock time to its zone) so a line never breaks between
 * them, on cards, in tables and anywhere else the formatters below are shown (ISO 80000-1 writes a space between
 * number and unit; typesetting keeps the pair on one line, common practice).
 */
export const NBSP = "\u00a0";

/** A percentage for labels: "97 %", "0.4 %", "< 0.1 %" (no-break spaces). */
export function formatPercent(fraction: number): string {
  const pct = fraction * 100;
  if (pct > 0 && pct < 0.1) return `<${NBSP}0.1${NBSP}%`;
  if (pct > 99.9 && pct < 100) return `>${NBSP}99.9${NBSP}%`;
  return `${pct >= 10 || pct === 0 ? Math.round(pct) : pct.toFixed(1)}${NBSP}%`;
}
