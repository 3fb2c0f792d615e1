import { loadPeople, loadShifts } from "@/lib/data/review";
import { personRows, shiftRows } from "@/lib/review/groups";
import { histogramOf, type HistogramBin } from "@/lib/review/histogram";
import { loadReviewScope, type ReviewReport, type ReviewRequest } from "@/lib/review/report";
import { stepIds, type StepId } from "@/lib/review/steps";
import { summariseSteps } from "@/lib/review/summary";
import { weeklyTrend } from "@/lib/review/trend";

/* Build the review: one use case, reading storage (the scope, shifts, people) and then the pure figures. */

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
    curves: scope.curves,
  };
}
