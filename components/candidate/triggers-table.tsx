import { Badge } from "@/components/ui/badge";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { SOLAR_MASS_UNIT, trimmedPrecision } from "@/lib/format/uncertainty";
import { diffAgainstPreferred, signed, type TriggerNumbers } from "@/lib/triggers/diff";
import type { Stage } from "@/db/schema/candidates";
import { stageLabels } from "./stage-badge";

/** One trigger as the page hands it to the browser (times as Unix ms). */
export interface TriggerRow extends TriggerNumbers {
  id: string;
  source: string;
  externalId: string;
  revision: number;
  preferred: boolean;
  receivedAtMs: number;
  stage: Stage;
  withdrawn: boolean;
}

function Diff({ text, title }: { text: string | null; title: string }) {
  if (text === null) return null;
  return (
    <span className="block text-xs text-faint" title={title}>
      {text}
    </span>
  );
}

/** Each pipeline's report of the signal, the preferred one marked; the others' numbers beside their difference. */
export function TriggersTable({ rows, timeZone, action }: { rows: TriggerRow[]; timeZone: string; action?: (row: TriggerRow) => React.ReactNode }) {
  const preferred = rows.find((r) => r.preferred) ?? rows[0];
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm" data-testid="triggers-table">
        <caption className="sr-only">Triggers grouped into this candidate; differences are against the preferred trigger</caption>
        <thead className="text-left text-xs text-muted">
          <tr>
            <th scope="col" className="py-1 pr-3 font-medium">Pipeline</th>
            <th scope="col" className="py-1 pr-3 font-medium">Trigger</th>
            <th scope="col" className="py-1 pr-3 font-medium">Event time</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">SNR</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">False alarms</th>
            <th scope="col" className="py-1 pr-3 text-right font-medium">𝓜<sub>det</sub></th>
            <th scope="col" className="py-1 pr-3 font-medium">Received</th>
            {action ? <th scope="col" className="py-1 font-medium"><span className="sr-only">Actions</span></th> : null}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => {
            const d = preferred && !row.preferred ? diffAgainstPreferred(row, preferred) : null;
            return (
              <tr key={row.id} className="border-t border-line align-top" data-testid="trigger-row" data-preferred={row.preferred}>
                <td className="py-1.5 pr-3">
                  <span className="font-medium">{row.source}</span>
                  <span className="mt-0.5 flex flex-wrap gap-1">
                    {row.preferred ? <Badge tone="accent">preferred</Badge> : null}
                    {row.withdrawn ? <Badge tone="alarm">withdrawn</Badge> : <span className="text-xs text-faint">{stageLabels[row.stage]}</span>}
                  </span>
                </td>
                <td className="py-1.5 pr-3 font-mono text-xs">
                  {row.externalId} <span className="text-faint">r{row.revision}</span>
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 tabular-nums">
                  <time dateTime={isoUtc(row.eventTimeMs)}>{formatInZone(row.eventTimeMs, timeZone)}</time>
                  <Diff text={d ? `${signed(d.eventTimeOffsetMs / 1000, 3)} s` : null} title="event time minus the preferred trigger's" />
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 text-right tabular-nums">
                  {row.networkSnr.toFixed(1)}
                  <Diff text={d ? signed(d.networkSnrDelta, 1) : null} title="network SNR minus the preferred trigger's" />
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 text-right tabular-nums">
                  {formatFalseAlarmRate(row.falseAlarmRatePerYear)}
                  <Diff
                    text={d?.falseAlarmRateRatio != null ? `×${trimmedPrecision(d.falseAlarmRateRatio, 2)}` : null}
                    title="false-alarm rate as a multiple of the preferred trigger's"
                  />
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 text-right tabular-nums">
                  {row.chirpMassDetectorFrame === null ? "not fitted" : `${trimmedPrecision(row.chirpMassDetectorFrame, 4)}\u00a0${SOLAR_MASS_UNIT}`}
                  <Diff
                    text={d?.chirpMassDetectorFrameDelta != null ? `${signed(d.chirpMassDetectorFrameDelta, 3)}\u00a0${SOLAR_MASS_UNIT}` : null}
                    title="detector-frame chirp mass minus the preferred trigger's (rapid estimates)"
                  />
                  {d && (d.detectorsOnlyHere.length > 0 || d.detectorsMissingHere.length > 0) ? (
                    <span className="block text-xs text-faint">
                      {[...d.detectorsOnlyHere.map((x) => `+${x}`), ...d.detectorsMissingHere.map((x) => `−${x}`)].join(" ")}
                    </span>
                  ) : null}
                </td>
                <td className="whitespace-nowrap py-1.5 pr-3 text-xs text-muted">
                  <time dateTime={isoUtc(row.receivedAtMs)}>{formatInZone(row.receivedAtMs, timeZone)}</time>
                </td>
                {action ? <td className="whitespace-nowrap py-1.5 text-right">{action(row)}</td> : null}
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
