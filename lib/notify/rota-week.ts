import { TZDate } from "@date-fns/tz";
import { addDays, format, startOfDay, startOfWeek } from "date-fns";

export interface DaySpan {
  /** yyyy-MM-dd in the viewer's zone */
  key: string;
  label: string;
  startMs: number;
  endMs: number;
}

/** Monday 00:00 of the week holding `atMs`, in `timeZone` (weeks start on Monday, ISO 8601). */
export function weekStartMs(atMs: number, timeZone: string): number {
  return startOfWeek(new TZDate(atMs, timeZone), { weekStartsOn: 1 }).getTime();
}

/** The seven local days from a week start; a day is 23 or 25 hours long when the clocks change. */
export function weekDays(startMs: number, timeZone: string): DaySpan[] {
  const first = startOfDay(new TZDate(startMs, timeZone));
  return Array.from({ length: 7 }, (_, i) => {
    const day = addDays(first, i);
    return { key: format(day, "yyyy-MM-dd"), label: format(day, "EEE d MMM"), startMs: day.getTime(), endMs: addDays(day, 1).getTime() };
  });
}

/** "yyyy-MM-dd" read as a local date in `timeZone` → that day's start (for ?week= links). */
export function localDateToMs(date: string, timeZone: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return null;
  const ms = new TZDate(Number(m[1]), Number(m[2]) - 1, Number(m[3]), timeZone).getTime();
  return Number.isNaN(ms) ? null : ms;
}

export function localDateKey(ms: number, timeZone: string): string {
  return format(new TZDate(ms, timeZone), "yyyy-MM-dd");
}

/** "Tue 14:00" in the zone. */
export function dayClock(ms: number, timeZone: string): string {
  return format(new TZDate(ms, timeZone), "EEE HH:mm");
}

export interface Segment<T> {
  item: T;
  topFraction: number;
  heightFraction: number;
  lane: number;
  lanes: number;
  continuesBefore: boolean;
  continuesAfter: boolean;
}

/** Pieces of [start, end) spans that fall in one day, laid out in side-by-side lanes where they overlap. */
export function layoutDay<T extends { startMs: number; endMs: number }>(items: readonly T[], day: DaySpan): Segment<T>[] {
  const length = day.endMs - day.startMs;
  const inDay = items
    .filter((s) => s.startMs < day.endMs && s.endMs > day.startMs)
    .sort((a, b) => a.startMs - b.startMs || b.endMs - a.endMs);
  const laneEnds: number[] = [];
  const placed = inDay.map((item) => {
    let lane = laneEnds.findIndex((end) => end <= item.startMs);
    if (lane === -1) lane = laneEnds.length;
    laneEnds[lane] = item.endMs;
    const from = Math.max(item.startMs, day.startMs);
    const to = Math.min(item.endMs, day.endMs);
    return {
      item,
      topFraction: (from - day.startMs) / length,
      heightFraction: (to - from) / length,
      lane,
      lanes: 1,
      continuesBefore: item.startMs < day.startMs,
      continuesAfter: item.endMs > day.endMs,
    };
  });
  const lanes = Math.max(1, laneEnds.length);
  return placed.map((p) => ({ ...p, lanes }));
}

/** The week a rota page shows: the one holding `?week=yyyy-MM-dd` (local date), else the current one. */
export function shownWeek(week: string | undefined, timeZone: string, nowMs: number = Date.now()): { nowMs: number; weekStart: number } {
  const at = (week ? localDateToMs(week, timeZone) : null) ?? nowMs;
  return { nowMs, weekStart: weekStartMs(at, timeZone) };
}
