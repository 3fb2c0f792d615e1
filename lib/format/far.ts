import { groupedNumber, NBSP, roundSignificant } from "./numbers";

/** Days in a Julian year, the year false-alarm rates are quoted in (common practice). */
export const DAYS_PER_YEAR = 365.25;

/** Rates between 1 and this many per year read "N per year"; above it "1 per N days". */
const PER_YEAR_LIMIT = 12;

/**
 * A false-alarm rate (per year) in a unit a person reads at a glance:
 * below 1 per year "1 per N years"; 1–12 per year "N per year"; up to one a day "1 per N days"; above "N per day".
 * N has two significant figures, so "1 per 50 years" rather than "1 per 49.7 years".
 */
export function formatFalseAlarmRate(perYear: number): string {
  if (!Number.isFinite(perYear) || perYear < 0) return "unknown";
  if (perYear === 0) return "none expected";
  if (perYear < 1) {
    const years = roundSignificant(1 / perYear, 2);
    return years === 1 ? `1${NBSP}per year` : `1 per ${bigCount(years)}${NBSP}years`;
  }
  if (perYear < PER_YEAR_LIMIT) return `${groupedNumber(roundSignificant(perYear, 2))}${NBSP}per year`;
  const perDay = perYear / DAYS_PER_YEAR;
  if (perDay <= 1) {
    const days = roundSignificant(1 / perDay, 2);
    return days === 1 ? `1${NBSP}per day` : `1 per ${groupedNumber(days)}${NBSP}days`;
  }
  return `${groupedNumber(roundSignificant(perDay, 2))}${NBSP}per day`;
}

/** The exact figure for a tooltip: "2.00e-2 per year". */
export function formatFalseAlarmRateExact(perYear: number): string {
  return `${perYear.toExponential(2)} per year`;
}

function bigCount(n: number): string {
  if (n >= 1e9) return `${groupedNumber(roundSignificant(n / 1e9, 2))}${NBSP}billion`;
  if (n >= 1e6) return `${groupedNumber(roundSignificant(n / 1e6, 2))}${NBSP}million`;
  return groupedNumber(n);
}
