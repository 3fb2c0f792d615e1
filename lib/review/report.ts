import { getSetting, type SettingValue } from "@/lib/data/settings";
import { loadPeople, loadShift, loadShifts, type ReviewFilters } from "@/lib/data/review";
import type { Tx } from "@/db";
import { reviewCandidates, type CandidateReview } from "./evaluate";
import { involves, loadCandidateFacts } from "./facts";
import { personRows, shiftRows, type PersonRow, type ShiftRow } from "./groups";
import { histogramOf, type HistogramBin } from "./histogram";
import { stepDeadlinesMs, stepIds, type StepId } from "./steps";
import { summariseSteps, type StepFigures } from "./summary";
import { weeklyTrend, type WeekPoint } from "./trend";

export interface ReviewRequest extends ReviewFilters {
  shiftId?: string;
  personId?: string;
  timeZone: string;
  nowMs: number;
}

export interface ReviewScope {
  fromMs: number;
  toMs: number;
  deadlines: SettingValue<"deadlines">;
  deadlinesMs: Record<StepId, number>;
  rows: CandidateReview[];
}

/**
 * The candidates in scope with their evaluated steps. A shift narrows the range to the shift; a person keeps the
 * candidates they finished a step of (or own). Deadlines are read now, so a change applies to every figure at once.
 */
export async function loadReviewScope(req: ReviewRequest, q?: Tx): Promise<ReviewScope | null> {
  let { fromMs, toMs } = req;
  if (req.shiftId) {
    const shift = await loadShift(req.shiftId, q);
    if (!shift) return null;
    fromMs = Math.max(fromMs, shift.startsAtMs);
    toMs = Math.min(toMs, shift.endsAtMs);
  }
  const deadlines = await getSetting("deadlines", q);
  const deadlinesMs = stepDeadlinesMs(deadlines);
  let facts = toMs > fromMs ? await loadCandidateFacts({ ...req, fromMs, toMs }, req.nowMs, q) : [];
  if (req.personId) facts = facts.filter((f) => involves(f, req.personId as string));
  return { fromMs, toMs, deadlines, deadlinesMs, rows: reviewCandidates(facts, deadlinesMs, req.nowMs) };
}

export interface ReviewReport {
  fromMs: number;
  toMs: number;
  nowMs: number;
  timeZone: string;
  deadlines: SettingValue<"deadlines">;
  deadlinesMs: Record<StepId, number>;
  candidates: number;
  steps: Record<StepId, StepFigures>;
  histograms: Record<StepId, HistogramBin[]>;
  trend: WeekPoint[];
  shifts: ShiftRow[];
  people: PersonRow[];
}

/** Everything the review page draws, from one scope load (see lib/data/review.ts for the queries). */
export async function buildReviewReport(req: ReviewRequest): Promise<ReviewReport | null> {
  const scope = await loadReviewScope(req);
  if (!scope) return null;
  const { rows, deadlinesMs } = scope;
  const histograms = {} as Record<StepId, HistogramBin[]>;
  for (const step of stepIds) histograms[step] = histogramOf(rows.map((r) => r.steps[step]), deadlinesMs[step]);
  const [shifts, people] = await Promise.all([loadShifts(scope.fromMs, scope.toMs), loadPeople()]);
  return {
    fromMs: scope.fromMs,
    toMs: scope.toMs,
    nowMs: req.nowMs,
    timeZone: req.timeZone,
    deadlines: scope.deadlines,
    deadlinesMs,
    candidates: rows.length,
    steps: summariseSteps(rows),
    histograms,
    trend: weeklyTrend(rows, scope.fromMs, Math.min(scope.toMs, req.nowMs + 1), req.timeZone),
    // Shifts not yet begun have nothing to show.
    shifts: shiftRows(rows, shifts.filter((s) => s.startsAtMs <= req.nowMs && (!req.shiftId || s.id === req.shiftId))),
    people: personRows(rows, people),
  };
}
