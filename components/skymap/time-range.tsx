import { formatClock, formatInZone, isoUtc } from "@/lib/format/time";

/** "03-20 18:07 – 23:07 GMT+1" in the viewer's zone, ISO UTC on hover. */
export function TimeRange({ start, end, timeZone }: { start: string; end: string; timeZone: string }) {
  const startText = formatInZone(start, timeZone).slice(5, 16);
  return (
    <time dateTime={isoUtc(start)} title={`${isoUtc(start)} – ${isoUtc(end)} (UTC)`} className="whitespace-nowrap">
      {startText} – {formatClock(end, timeZone)}
    </time>
  );
}
