import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";

/** A UTC instant in the viewer's zone with the zone named: "2025-03-01 15:03:12 GMT+1". */
export function formatInZone(instant: Date | number | string, timeZone: string, pattern = "yyyy-MM-dd HH:mm:ss"): string {
  const date = new Date(instant);
  if (Number.isNaN(date.getTime())) return "—";
  const zone = safeZone(timeZone);
  const zoned = new TZDate(date.getTime(), zone);
  return `${format(zoned, pattern)} ${zoneLabel(zoned, zone)}`;
}

/** Short clock time in the viewer's zone: "15:03 GMT+1". */
export function formatClock(instant: Date | number | string, timeZone: string): string {
  return formatInZone(instant, timeZone, "HH:mm");
}

/** ISO 8601 UTC, for hover titles and machine-readable attributes. */
export function isoUtc(instant: Date | number | string): string {
  const date = new Date(instant);
  return Number.isNaN(date.getTime()) ? "" : date.toISOString();
}

/** "UTC" for the UTC zones, else the short offset name ("GMT+1"), which is unambiguous. */
function zoneLabel(zoned: TZDate, zone: string): string {
  return /^(Etc\/)?(UTC|UCT|GMT|Zulu|Universal)$/.test(zone) ? "UTC" : format(zoned, "zzz");
}

function safeZone(timeZone: string): string {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone });
    return timeZone;
  } catch {
    return "UTC";
  }
}
