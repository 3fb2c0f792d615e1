import type { EvaluatedStep } from "./evaluate";
import { formatDurationMs } from "./format";

/** Bin edges as fractions of the step's deadline: finer below it, coarser above (common practice for SLA plots). */
const edgeFractions = [0, 0.25, 0.5, 0.75, 1, 1.5, 2, 4] as const;

export interface HistogramBin {
  /** stable key for the click-through list: "before", "b0" … "b7", "open" */
  key: string;
  label: string;
  count: number;
  /** every duration in the bin is past the deadline */
  late: boolean;
  kind: "before" | "done" | "open";
}

/**
 * The bin key of one step record: "before" for negative durations (a pre-merger alert), "b<i>" for done steps
 * with edge[i] < duration ≤ edge[i+1] (the first bin includes 0), "open" for open steps, null otherwise.
 */
export function binKeyOf(timing: Pick<EvaluatedStep, "status" | "durationMs">, deadlineMs: number): string | null {
  if (timing.status === "open") return "open";
  if (timing.status !== "done" || timing.durationMs === null) return null;
  const d = timing.durationMs;
  if (d < 0) return "before";
  for (let i = 1; i < edgeFractions.length; i++) {
    if (d <= (edgeFractions[i] as number) * deadlineMs) return `b${i - 1}`;
  }
  return `b${edgeFractions.length - 1}`;
}

/** Histogram of one step with bins tied to its deadline, so "left of the line = on time" reads at a glance. */
export function histogramOf(timings: readonly EvaluatedStep[], deadlineMs: number): HistogramBin[] {
  const counts = new Map<string, number>();
  for (const t of timings) {
    const key = binKeyOf(t, deadlineMs);
    if (key) counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  const bins: HistogramBin[] = [];
  const before = counts.get("before") ?? 0;
  if (before > 0) bins.push({ key: "before", label: "before merger", count: before, late: false, kind: "before" });
  for (let i = 0; i < edgeFractions.length; i++) {
    const lo = (edgeFractions[i] as number) * deadlineMs;
    const next = edgeFractions[i + 1];
    const label = next === undefined ? `> ${formatDurationMs(lo)}` : i === 0 ? `≤ ${formatDurationMs(next * deadlineMs)}` : `${formatDurationMs(lo)} – ${formatDurationMs(next * deadlineMs)}`;
    bins.push({ key: `b${i}`, label, count: counts.get(`b${i}`) ?? 0, late: (edgeFractions[i] as number) >= 1, kind: "done" });
  }
  bins.push({ key: "open", label: "still open", count: counts.get("open") ?? 0, late: false, kind: "open" });
  return bins;
}

export const histogramBinKeys = ["before", ...edgeFractions.map((_, i) => `b${i}`), "open"] as const;
