import { Badge } from "@/components/ui/badge";
import type { CandidateRevisionSummary } from "@/lib/data/candidate-detail";
import type { HeadlineChange } from "@/lib/data/headline";
import { classLabels } from "@/lib/format/classes";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { SOLAR_MASS_UNIT, trimmedPrecision } from "@/lib/format/uncertainty";
import type { SourceClass, Stage } from "@/db/schema/candidates";
import { StageBadge, stageLabels } from "./stage-badge";

function show(field: HeadlineChange["field"], value: unknown, timeZone: string): string {
  if (value === null || value === undefined) return "none";
  switch (field) {
    case "falseAlarmRatePerYear":
      return typeof value === "number" ? formatFalseAlarmRate(value) : String(value);
    case "chirpMassDetectorFrame":
      return typeof value === "number" ? `${trimmedPrecision(value, 4)}\u00a0${SOLAR_MASS_UNIT}` : String(value);
    case "networkSnr":
      return typeof value === "number" ? value.toFixed(1) : String(value);
    case "dominantClass":
      return classLabels[value as SourceClass] ?? String(value);
    case "stage":
      return stageLabels[value as Stage] ?? String(value);
    case "eventTime":
      return formatInZone(String(value), timeZone);
    case "detectors":
      return Array.isArray(value) ? value.join(" ") : String(value);
    default:
      return String(value);
  }
}

const fieldNames: Record<HeadlineChange["field"], string> = {
  stage: "Stage",
  eventTime: "Event time",
  networkSnr: "SNR",
  falseAlarmRatePerYear: "False alarms",
  detectors: "Detectors",
  chirpMassDetectorFrame: "Chirp mass (det.)",
  dominantClass: "Top class",
};

/** Every revision the feed sent, newest first, with what changed from the one before. */
export function RevisionTimeline({ revisions, timeZone }: { revisions: CandidateRevisionSummary[]; timeZone: string }) {
  return (
    <ol className="space-y-3">
      {[...revisions].reverse().map((r) => (
        <li key={r.revision} className="border-l-2 border-line pl-3">
          <div className="flex flex-wrap items-center gap-2 text-sm">
            <span className="font-semibold">Revision {r.revision}</span>
            <StageBadge stage={r.stage} />
            {r.isCurrent ? <Badge tone="accent">current</Badge> : null}
            {r.arrivedLate ? <Badge tone="warn">arrived late</Badge> : null}
            <time className="text-xs text-muted" dateTime={isoUtc(r.receivedAt)} title={isoUtc(r.receivedAt)}>
              received {formatInZone(r.receivedAt, timeZone)}
            </time>
          </div>
          {r.changes.length ? (
            <ul className="mt-1 space-y-0.5 text-xs text-muted">
              {r.changes.map((c) => (
                <li key={c.field}>
                  {fieldNames[c.field]}: {show(c.field, c.from, timeZone)} → <span className="text-fg">{show(c.field, c.to, timeZone)}</span>
                </li>
              ))}
            </ul>
          ) : (
            <p className="mt-1 text-xs text-faint">{r.revision === revisions[0]?.revision ? "First revision." : "No headline change."}</p>
          )}
        </li>
      ))}
    </ol>
  );
}
