"use client";

import { AlarmClock, Hourglass } from "lucide-react";
import { cn } from "@/components/ui/cn";
import { formatDurationMs } from "@/lib/review/format";
import { stepIds, steps, type StepId } from "@/lib/review/steps";
import type { StepFigures } from "@/lib/review/summary";

/** The six steps side by side; a row is also the switch that picks the step the charts and tables below show. */
export function StepTable({
  figures,
  deadlinesMs,
  selected,
  onSelect,
  onListLate,
}: {
  figures: Record<StepId, StepFigures>;
  deadlinesMs: Record<StepId, number>;
  selected: StepId;
  onSelect: (step: StepId) => void;
  onListLate: (step: StepId) => void;
}) {
  return (
    <div className="relative overflow-x-auto rounded-lg border border-line bg-surface">
      <table className="w-full whitespace-nowrap text-sm" data-testid="step-table">
        <caption className="sr-only">Durations of each response step; pick a row to chart it</caption>
        <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-muted">
          <tr>
            <th className="px-3 py-2 font-medium">Step</th>
            <th className="px-3 py-2 text-right font-medium">Deadline</th>
            <th className="px-3 py-2 text-right font-medium">Done</th>
            <th className="px-3 py-2 text-right font-medium">Median</th>
            <th className="px-3 py-2 text-right font-medium" title="90th percentile (Hyndman & Fan type 7)">
              p90
            </th>
            <th className="px-3 py-2 text-right font-medium">Max</th>
            <th className="px-3 py-2 text-right font-medium">Over deadline</th>
            <th className="px-3 py-2 text-right font-medium">Still open</th>
          </tr>
        </thead>
        <tbody>
          {stepIds.map((id) => {
            const f = figures[id];
            const active = id === selected;
            const measured = f.count + f.open;
            return (
              <tr
                key={id}
                aria-selected={active}
                className={cn("border-b border-line last:border-0", active ? "bg-accent/10" : "hover:bg-raised")}
              >
                <th scope="row" className="px-3 py-2 text-left font-normal">
                  <button
                    type="button"
                    onClick={() => onSelect(id)}
                    aria-pressed={active}
                    className={cn("text-left", active ? "font-semibold text-fg" : "text-fg hover:text-accent")}
                  >
                    {steps[id].label}
                    <span className="block text-xs font-normal text-muted">{steps[id].span}</span>
                  </button>
                </th>
                <td
                  className="whitespace-nowrap px-3 py-2 text-right font-mono text-muted"
                  title={id === "acknowledge" ? "after receipt: the paging and acknowledgement deadlines together, as on the board" : undefined}
                >
                  {formatDurationMs(id === "acknowledge" ? deadlinesMs.page + deadlinesMs.acknowledge : deadlinesMs[id])}
                </td>
                <td className="px-3 py-2 text-right font-mono">{f.count}</td>
                <td className="px-3 py-2 text-right font-mono">{formatDurationMs(f.medianMs)}</td>
                <td className="px-3 py-2 text-right font-mono">{formatDurationMs(f.p90Ms)}</td>
                <td className="px-3 py-2 text-right font-mono">{formatDurationMs(f.maxMs)}</td>
                <td className="px-3 py-2 text-right">
                  {f.overDeadline > 0 ? (
                    <button
                      type="button"
                      onClick={() => onListLate(id)}
                      className="inline-flex items-center gap-1 font-mono text-alarm hover:underline"
                      title="List the late ones"
                    >
                      <AlarmClock aria-hidden className="h-3.5 w-3.5" />
                      {f.overDeadline}
                      <span className="text-xs text-muted">({Math.round((100 * f.overDeadline) / Math.max(1, measured))}&nbsp;%)</span>
                    </button>
                  ) : (
                    <span className="font-mono text-ok">0</span>
                  )}
                </td>
                <td className="px-3 py-2 text-right font-mono">
                  {f.open > 0 ? (
                    <span className="text-warn" title={`oldest open for ${formatDurationMs(f.oldestOpenMs)}`}>
                      <span className="inline-flex items-center gap-1">
                        <Hourglass aria-hidden className="h-3.5 w-3.5" />
                        {f.open}
                      </span>
                      <span className="block text-xs text-muted">oldest {formatDurationMs(f.oldestOpenMs)}</span>
                    </span>
                  ) : (
                    <span className="text-faint">0</span>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
