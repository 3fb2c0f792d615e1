"use client";

import { Bar, CartesianGrid, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatDurationAxis, formatDurationMs, niceDurationTicks } from "@/lib/review/format";
import type { StepId } from "@/lib/review/steps";
import type { WeekPoint } from "@/lib/review/trend";

const dayFormat = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat("en-GB", { timeZone, day: "numeric", month: "short" }).format(new Date(iso));

/**
 * Week by week: median and 90th percentile of the step (lines, left axis, deadline dashed) and how many were late
 * (bars, right axis). Clicking a week's bar lists its late candidates.
 */
export function TrendChart({
  trend,
  step,
  deadlineMs,
  timeZone,
  onPickWeek,
}: {
  trend: WeekPoint[];
  step: StepId;
  deadlineMs: number;
  timeZone: string;
  onPickWeek: (weekStart: string) => void;
}) {
  const data = trend.map((w) => ({
    weekStart: w.weekStart,
    label: dayFormat(w.weekStart, timeZone),
    median: w.steps[step].medianMs,
    p90: w.steps[step].p90Ms,
    late: w.steps[step].overDeadline,
    done: w.steps[step].count,
  }));
  const ticks = niceDurationTicks(Math.max(deadlineMs, ...data.map((d) => d.p90 ?? 0)));
  return (
    <figure className="space-y-2" aria-label="Weekly trend">
      <div className="h-64" data-testid="trend-chart">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 18, right: 8, bottom: 4, left: 8 }}>
            <CartesianGrid vertical={false} stroke="var(--c-line)" />
            <XAxis dataKey="label" tick={{ fill: "var(--c-muted)", fontSize: 11 }} />
            <YAxis yAxisId="ms" ticks={ticks} domain={[0, ticks[ticks.length - 1] ?? 0]} tickFormatter={(v: number) => formatDurationAxis(v)} tick={{ fill: "var(--c-muted)", fontSize: 11 }} width={56} />
            <YAxis yAxisId="n" orientation="right" allowDecimals={false} tick={{ fill: "var(--c-muted)", fontSize: 11 }} width={32} />
            <Tooltip
              contentStyle={{ background: "var(--c-surface)", border: "1px solid var(--c-line)", borderRadius: 6, fontSize: 12 }}
              formatter={(value, name) =>
                name === "late" ? [String(value), "late (click the bar to list)"] : [formatDurationMs(typeof value === "number" ? value : null), String(name)]
              }
            />
            <ReferenceLine
              yAxisId="ms"
              y={deadlineMs}
              stroke="var(--c-alarm)"
              strokeDasharray="5 4"
              label={{ value: "deadline", position: "insideTopLeft", fill: "var(--c-alarm)", fontSize: 11 }}
            />
            <Bar yAxisId="n" dataKey="late" name="late" fill="var(--c-alarm)" fillOpacity={0.35} cursor="pointer" isAnimationActive={false} onClick={(_, i) => data[i] && onPickWeek(data[i].weekStart)} />
            <Line yAxisId="ms" type="linear" dataKey="median" name="median" stroke="var(--c-accent)" strokeWidth={2} dot={{ r: 2 }} connectNulls={false} isAnimationActive={false} />
            <Line yAxisId="ms" type="linear" dataKey="p90" name="p90" stroke="var(--c-muted)" strokeDasharray="3 3" dot={false} connectNulls={false} isAnimationActive={false} />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <figcaption className="flex flex-wrap gap-x-4 text-xs text-muted">
        <span>weeks start Monday, {timeZone}</span>
        <span className="text-accent">— median</span>
        <span>- - 90th percentile</span>
        <span className="text-alarm">▮ late that week</span>
      </figcaption>
      <ul className="sr-only">
        {data.map((d) => (
          <li key={d.weekStart}>
            <button type="button" onClick={() => onPickWeek(d.weekStart)}>
              Week of {d.label}: median {formatDurationMs(d.median)}, p90 {formatDurationMs(d.p90)}, {d.late} late of {d.done}
            </button>
          </li>
        ))}
      </ul>
    </figure>
  );
}
