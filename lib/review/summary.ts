import { quantileType7 } from "./percentile";
import type { EvaluatedStep } from "./evaluate";
import { stepIds, type StepId } from "./steps";

/** One step's figures over a set of candidates. Durations in ms; null when there is nothing to measure. */
export interface StepFigures {
  /** steps done (the sample behind median / p90 / max) */
  count: number;
  medianMs: number | null;
  p90Ms: number | null;
  maxMs: number | null;
  /** done late plus open and already late */
  overDeadline: number;
  open: number;
  /** how long the oldest open one has been waiting */
  oldestOpenMs: number | null;
}

/** Collects one step's records and yields its figures; no intermediate arrays of records. */
export class FiguresAccumulator {
  private durations: number[] = [];
  private overDeadline = 0;
  private open = 0;
  private oldestOpenMs: number | null = null;

  add(t: EvaluatedStep): void {
    if (t.overDeadline) this.overDeadline += 1;
    if (t.durationMs === null) return;
    if (t.status === "done") this.durations.push(t.durationMs);
    else if (t.status === "open") {
      this.open += 1;
      if (this.oldestOpenMs === null || t.durationMs > this.oldestOpenMs) this.oldestOpenMs = t.durationMs;
    }
  }

  /** Count, median and 90th percentile (Hyndman & Fan type 7, see percentile.ts), maximum, late and open. */
  result(): StepFigures {
    const sorted = Float64Array.from(this.durations).sort();
    const n = sorted.length;
    return {
      count: n,
      medianMs: quantileType7(sorted, 0.5),
      p90Ms: quantileType7(sorted, 0.9),
      maxMs: n ? (sorted[n - 1] as number) : null,
      overDeadline: this.overDeadline,
      open: this.open,
      oldestOpenMs: this.oldestOpenMs,
    };
  }
}

export function summariseStep(timings: Iterable<EvaluatedStep>): StepFigures {
  const acc = new FiguresAccumulator();
  for (const t of timings) acc.add(t);
  return acc.result();
}

/** Figures for every step over the given per-candidate step records. */
export function summariseSteps(rows: ReadonlyArray<{ steps: Record<StepId, EvaluatedStep> }>): Record<StepId, StepFigures> {
  const accs = stepIds.map(() => new FiguresAccumulator());
  for (const row of rows) stepIds.forEach((step, i) => (accs[i] as FiguresAccumulator).add(row.steps[step]));
  const out = {} as Record<StepId, StepFigures>;
  stepIds.forEach((step, i) => (out[step] = (accs[i] as FiguresAccumulator).result()));
  return out;
}
