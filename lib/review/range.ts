import { TZDate } from "@date-fns/tz";
import { addDays, startOfDay } from "date-fns";

export const defaultRangeDays = 28;
/** Longer ranges are refused: three years of activity is past what one page should chew. */
export const maxRangeDays = 3 * 366;

export interface ResolvedRange {
  fromMs: number;
  toMs: number;
}

const isDay = (s: string) => /^\d{4}-\d{2}-\d{2}$/.test(s);

/** A day is midnight in the viewer's zone; an instant is itself. `end` days are inclusive (to the next midnight). */
function instantOf(value: string, timeZone: string, end: boolean): number {
  if (!isDay(value)) return Date.parse(value);
  const [y, m, d] = value.split("-").map(Number) as [number, number, number];
  const midnight = new TZDate(y, m - 1, d, timeZone);
  return (end ? addDays(midnight, 1) : midnight).getTime();
}

/**
 * The review range [from, to): given bounds, or the last 28 days ending at the end of today in the viewer's zone.
 * Returns an error message instead of throwing, so routes answer 422 and pages show it.
 */
export function resolveRange(
  query: { from?: string; to?: string },
  timeZone: string,
  nowMs: number,
): ResolvedRange | { error: string } {
  const endOfToday = addDays(startOfDay(new TZDate(nowMs, timeZone)), 1).getTime();
  const toMs = query.to ? instantOf(query.to, timeZone, true) : endOfToday;
  const fromMs = query.from
    ? instantOf(query.from, timeZone, false)
    : addDays(new TZDate(toMs, timeZone), -defaultRangeDays).getTime();
  if (!Number.isFinite(fromMs) || !Number.isFinite(toMs)) return { error: "from/to are not valid dates" };
  if (fromMs >= toMs) return { error: "from must be before to" };
  if (toMs - fromMs > maxRangeDays * 86_400_000) return { error: `the range may span at most ${maxRangeDays} days` };
  return { fromMs, toMs };
}

/** The calendar day of an instant in a zone, as YYYY-MM-DD (for date inputs). */
export function dayInZone(ms: number, timeZone: string): string {
  const d = new TZDate(ms, timeZone);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`;
}
