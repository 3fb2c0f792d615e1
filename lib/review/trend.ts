import { TZDate } from "@date-fns/tz";
import { addWeeks } from "date-fns";
import { weekStartMs } from "@/lib/notify/rota-week";
import type { CandidateReview } from "./evaluate";
import type { StepId } from "./steps";
import { summariseSteps, type StepFigures } from "./summary";

export interface WeekPoint {
  /** Monday 00:00 in the viewer's time zone, as an ISO instant */
  weekStart: string;
  candidates: number;
  steps: Record<StepId, StepFigures>;
}

/** Week starts from the week holding `fromMs` up to `toMs` (at most 600: a typo'd range builds no endless axis). */
export function weekStarts(fromMs: number, toMs: number, timeZone: string): number[] {
  const out: number[] = [];
  let cursor = new TZDate(weekStartMs(fromMs, timeZone), timeZone);
  while (cursor.getTime() < toMs && out.length < 600) {
    out.push(cursor.getTime());
    cursor = addWeeks(cursor, 1);
  }
  return out;
}

/** Index of the last boundary ≤ ms (binary search), or −1. */
function weekIndex(boundaries: readonly number[], ms: number): number {
  let lo = 0;
  let hi = boundaries.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((boundaries[mid] as number) <= ms) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

/**
 * Week by week (by receipt time), every week between `fromMs` and `toMs` present even when empty, so a quiet week
 * shows as a gap rather than vanishing from the axis.
 */
export function weeklyTrend(rows: readonly CandidateReview[], fromMs: number, toMs: number, timeZone: string): WeekPoint[] {
  if (!(toMs > fromMs)) return [];
  const boundaries = weekStarts(fromMs, toMs, timeZone);
  const buckets: CandidateReview[][] = boundaries.map(() => []);
  for (const row of rows) buckets[weekIndex(boundaries, row.facts.receivedAtMs)]?.push(row);
  return boundaries.map((start, i) => {
    const list = buckets[i] as CandidateReview[];
    return { weekStart: new Date(start).toISOString(), candidates: list.length, steps: summariseSteps(list) };
  });
}
