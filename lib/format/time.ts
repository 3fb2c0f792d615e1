import { NBSP } from "./numbers";

/**
 * Times for people: stored UTC instants shown in the viewer's zone with the zone named, ISO UTC for hovers.
 * Built on Intl (no date library) so the board's first-load script stays small.
 */
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string, withSeconds: boolean): Intl.DateTimeFormat {
  const key = `${timeZone}|${withSeconds}`;
  let formatter = formatters.get(key);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat("en-US", {
      timeZone,
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      ...(withSeconds ? { second: "2-digit" } : {}),
      hourCycle: "h23",
      timeZoneName: "short",
    });
    formatters.set(key, formatter);
  }
  return formatter;
}

interface ZonedParts {
  date: string;
  time: string;
  zone: string;
}

function zonedParts(instant: Date | number | string, timeZone: string, withSeconds: boolean): ZonedParts | null {
  const date = new Date(instant);
  if (Number.isNaN(date.getTime())) return null;
  const zone = safeZone(timeZone);
  const parts = Object.fromEntries(formatterFor(zone, withSeconds).formatToParts(date).map((p) => [p.type, p.value]));
  const time = withSeconds ? `${parts.hour}:${parts.minute}:${parts.second}` : `${parts.hour}:${parts.minute}`;
  return { date: `${parts.year}-${parts.month}-${parts.day}`, time, zone: zoneLabel(zone, parts.timeZoneName ?? "") };
}

/** "2025-03-01 15:03:12 GMT+1" in the viewer's zone; the clock time and its zone joined by a no-break space. */
export function formatInZone(instant: Date | number | string, timeZone: string): string {
  const p = zonedParts(instant, timeZone, true);
  return p ? `${p.date} ${p.time}${NBSP}${p.zone}` : "—";
}

/**
 * "15:03 GMT+1": the short clock time in the viewer's zone (without the zone name where a tooltip carries it); the
 * time and its zone are joined by a no-break space, so "GMT-3" never goes to a line of its own.
 */
export function formatClock(instant: Date | number | string, timeZone: string, options: { zone?: boolean } = {}): string {
  const p = zonedParts(instant, timeZone, false);
  if (!p) return "—";
  return options.zone === false ? p.time : `${p.time}${NBSP}${p.zone}`;
}

/**
 * An observing window in the viewer's zone, "11-30 22:00 → 05:30 GMT-3" (the end's date is shown only when it falls
 * on another day than the start; a date outside `thisYear` carries its year, "2027-01-02 22:00", so a window far
 * ahead never reads as this year's); "now → …" without a start, "… → open end" without an end; null with neither.
 */
export function formatWindow(start: Date | number | string | null, end: Date | number | string | null, timeZone: string, thisYear: number): string | null {
  if (start === null && end === null) return null;
  const from = start === null ? null : zonedParts(start, timeZone, false);
  const to = end === null ? null : zonedParts(end, timeZone, false);
  const dayOf = (p: ZonedParts) => (p.date.startsWith(`${thisYear}-`) ? p.date.slice(5) : p.date);
  // Each end is one unbreakable piece ("11-30 22:00", "05:30 GMT-3"); lines may break only around the arrow.
  const fromText = from ? `${dayOf(from)}${NBSP}${from.time}` : "now";
  if (!to) return `${fromText}${from ? `${NBSP}${from.zone}` : ""} → open end`;
  const toText = from && from.date === to.date ? to.time : `${dayOf(to)}${NBSP}${to.time}`;
  return `${fromText} → ${toText}${NBSP}${to.zone}`;
}

/** The calendar year of `instant` in `timeZone` (for `formatWindow`'s "this year"). */
export function yearInZone(instant: Date | number, timeZone: string): number {
  const p = zonedParts(instant, timeZone, false);
  return p ? Number(p.date.slice(0, 4)) : new Date(instant).getUTCFullYear();
}

/** ISO 8601 UTC, for hover titles and machine-readable attributes. */
export function isoUtc(instant: Date | number | string): string {
  const date = new Date(instant);
  return Number.isNaN(date.getTime()) ? "" : date.toISOString();
}

/** "UTC" for the UTC zones, else Intl's short name ("GMT+1", "CST"). */
function zoneLabel(zone: string, intlName: string): string {
  return /^(Etc\/)?(UTC|UCT|GMT|Zulu|Universal)$/.test(zone) ? "UTC" : intlName;
}

function safeZone(timeZone: string): string {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone });
    return timeZone;
  } catch {
    return "UTC";
  }
}

/**
 * ISO 8601 with the zone's offset at that instant ("2030-03-20T21:15:00-03:00"; "Z" in UTC), to the second:
 * a site's local time in machine-readable form. An unknown zone falls back to UTC.
 */
export function isoInZone(instant: Date | number | string, timeZone: string): string {
  const date = new Date(instant);
  if (Number.isNaN(date.getTime())) return "";
  const zone = safeZone(timeZone);
  const parts = Object.fromEntries(isoFormatter(zone).formatToParts(date).map((p) => [p.type, p.value]));
  const wall = Date.UTC(Number(parts.year), Number(parts.month) - 1, Number(parts.day), Number(parts.hour), Number(parts.minute), Number(parts.second));
  const offsetMin = Math.round((wall - Math.floor(date.getTime() / 1000) * 1000) / 60_000);
  const sign = offsetMin < 0 ? "-" : "+";
  const abs = Math.abs(offsetMin);
  const offset = offsetMin === 0 ? "Z" : `${sign}${String(Math.floor(abs / 60)).padStart(2, "0")}:${String(abs % 60).padStart(2, "0")}`;
  return `${parts.year}-${parts.month}-${parts.day}T${parts.hour}:${parts.minute}:${parts.second}${offset}`;
}

const isoFormatters = new Map<string, Intl.DateTimeFormat>();
function isoFormatter(timeZone: string): Intl.DateTimeFormat {
  let formatter = isoFormatters.get(timeZone);
  if (!formatter) {
    formatter = new Intl.DateTimeFormat("en-US", { timeZone, year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", second: "2-digit", hourCycle: "h23" });
    isoFormatters.set(timeZone, formatter);
  }
  return formatter;
}
