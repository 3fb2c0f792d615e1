import { formatInZone, isoUtc } from "@/lib/format/time";

/** An instant in the viewer's zone, zone named, with ISO UTC on hover. */
export function ZonedTime({ at, timeZone, className }: { at: string | number | Date; timeZone: string; className?: string }) {
  const iso = isoUtc(at);
  return (
    <time dateTime={iso} title={`${iso} (UTC)`} className={className}>
      {formatInZone(at, timeZone)}
    </time>
  );
}
