"use client";

import { Bar, BarChart, CartesianGrid, Cell, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { HistogramBin } from "@/lib/review/histogram";
import { formatDurationMs } from "@/lib/review/format";

const colours = { onTime: "var(--c-ok)", late: "var(--c-alarm)", open: "var(--c-warn)", before: "var(--c-accent)" };

function colourOf(bin: HistogramBin): string {
  if (bin.kind === "open") return colours.open;
  if (bin.kind === "before") return colours.before;
  return bin.late ? colours.late : colours.onTime;
}

/**
 * How long the step took, in bins tied to its deadline: green bars finished in time, red ones late, amber is
 * still open. A dashed line stands at the deadline. Clicking a bar lists its candidates.
 */
export function DistributionChart({
  bins,
  deadlineMs,
  onPick,
}: {
  bins: HistogramBin[];
  deadlineMs: number;
  onPick: (bin: HistogramBin) => void;
}) {
  const firstLate = bins.find((b) => b.late);
  const total = bins.reduce((n, b) => n + b.count, 0);
  return (
    <figure className="space-y-2" aria-label="Distribution of durations">
      <div className="h-64" data-testid="distribution-chart">
        <ResponsiveContainer width="100%" height="100%">
          <BarChart data={bins} margin={{ top: 18, right: 8, bottom: 4, left: 0 }}>
            <CartesianGrid vertical={false} stroke="var(--c-line)" />
            <XAxis dataKey="label" tick={{ fill: "var(--c-muted)", fontSize: 11 }} interval={0} angle={-20} textAnchor="end" height={48} />
            <YAxis allowDecimals={false} tick={{ fill: "var(--c-muted)", fontSize: 11 }} width={36} />
            <Tooltip
              cursor={{ fill: "var(--c-raised)" }}
              contentStyle={{ background: "var(--c-surface)", border: "1px solid var(--c-line)", borderRadius: 6, fontSize: 12 }}
              formatter={(value) => [`${String(value)} candidate${value === 1 ? "" : "s"} — click to list`, ""]}
            />
            {firstLate ? (
              <ReferenceLine
                x={firstLate.label}
                position="start"
                stroke="var(--c-alarm)"
                strokeDasharray="5 4"
                label={{ value: `deadline ${formatDurationMs(deadlineMs)}`, position: "top", fill: "var(--c-alarm)", fontSize: 11 }}
              />
            ) : null}
            <Bar dataKey="count" radius={[3, 3, 0, 0]} cursor="pointer" isAnimationActive={false} onClick={(_, index) => bins[index] && onPick(bins[index])}>
              {bins.map((bin) => (
                <Cell key={bin.key} fill={colourOf(bin)} />
              ))}
            </Bar>
          </BarChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-xs text-muted">
        <span>{total} measured</span>
        <Legend colour={colours.onTime} text="in time" />
        <Legend colour={colours.late} text="late" />
        <Legend colour={colours.open} text="still open (any age)" />
        {bins.some((b) => b.kind === "before") ? <Legend colour={colours.before} text="alert before merger" /> : null}
      </figcaption>
      <ul className="sr-only">
        {bins.map((b) => (
          <li key={b.key}>
            <button type="button" onClick={() => onPick(b)}>
              {b.label}: {b.count}
              {b.late ? " (late)" : ""}
            </button>
          </li>
        ))}
      </ul>
    </figure>
  );
}

function Legend({ colour, text }: { colour: string; text: string }) {
  return (
    <span className="inline-flex items-center gap-1">
      <span aria-hidden className="inline-block h-2.5 w-2.5 rounded-sm" style={{ background: colour }} />
      {text}
    </span>
  );
}
