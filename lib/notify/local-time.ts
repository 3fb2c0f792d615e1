import { TZDate } from "@date-fns/tz";

/** Minutes since local midnight of `at` in `timeZone` (an IANA name; unknown names fall back to UTC). */
export function localMinuteOfDay(at: Date | number, timeZone: string): number {
  const ms = typeof at === "number" ? at : at.getTime();
  let local: TZDate;
  try {
    local = new TZDate(ms, timeZone);
    if (Number.isNaN(local.getHours())) local = new TZDate(ms, "UTC");
  } catch {
    local = new TZDate(ms, "UTC");
  }
  return local.getHours() * 60 + local.getMinutes();
}

/** "HH:mm" → minutes since midnight. */
export function parseLocalTime(hhmm: string): number {
  const [h, m] = hhmm.split(":").map(Number);
  return (h ?? 0) * 60 + (m ?? 0);
}

/**
 * Whether `at` falls inside the local window [start, end) in `timeZone`. A window whose end is before its start
 * runs over midnight (22:00–07:00).
 */
export function isWithinLocalWindow(at: Date | number, timeZone: string, start: string, end: string): boolean {
  const minute = localMinuteOfDay(at, timeZone);
  const from = parseLocalTime(start);
  const to = parseLocalTime(end);
  if (from === to) return false;
  return from < to ? minute >= from && minute < to : minute >= from || minute < to;
}
