import { NBSP } from "./numbers";

/**
 * A value with its 1σ uncertainty: the uncertainty to two significant figures and the value to the same decimal
 * place (common practice), e.g. (1.18763, 0.00412) → "1.1876 ± 0.0041". With no usable uncertainty the value
 * keeps four significant figures.
 */
export function formatWithUncertainty(value: number, sd: number | null | undefined, unit?: string): string {
  // No-break spaces throughout: "1.18 ± 0.04 M☉" stays on one line.
  const suffix = unit ? `${NBSP}${unit}` : "";
  if (!Number.isFinite(value)) return "—";
  if (sd === null || sd === undefined || !Number.isFinite(sd) || sd <= 0) {
    return `${trimmedPrecision(value, 4)}${suffix}`;
  }
  const exponent = Math.floor(Math.log10(sd));
  const decimals = Math.max(0, 1 - exponent);
  // Large uncertainties round to tens, hundreds…: keep the digits, show no decimals.
  const step = 10 ** (exponent - 1);
  const roundTo = (x: number) => (decimals > 0 ? x.toFixed(decimals) : String(Math.round(x / step) * step));
  return `${roundTo(value)}${NBSP}±${NBSP}${roundTo(sd)}${suffix}`;
}

/** A value alone to `digits` significant figures, without exponent notation for everyday magnitudes. */
export function trimmedPrecision(value: number, digits: number): string {
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs >= 1e-3 && abs < 1e6) return String(Number(value.toPrecision(digits)));
  return value.toExponential(digits - 1);
}

/** Solar masses, the unit of every mass Chirpdesk shows. */
export const SOLAR_MASS_UNIT = "M☉";
