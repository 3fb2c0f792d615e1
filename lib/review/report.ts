import { getSetting, type SettingValue } from "@/lib/data/settings";
import { loadShift, type ReviewFilters } from "@/lib/data/review";
import type { Tx } from "@/db";
import { reviewCandidates, type CandidateReview } from "./evaluate";
import { attachCoverageFacts, type ReviewCurve } from "./coverage-facts";
import { involves, loadCandidateFacts } from "./facts";
import type { PersonRow, ShiftRow } from "./groups";
import type { HistogramBin } from "./histogram";
import { stepDeadlinesMs, type StepId } from "./steps";
import type { StepFigures } from "./summary";
import type { WeekPoint } from "./trend";

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
  /** coverage curves of the candidates in scope that have observations on a sky map */
  curves: ReviewCurve[];
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
  const curves = await attachCoverageFacts(facts, q);
  if (req.personId) facts = facts.filter((f) => involves(f, req.personId as string));
  const kept = new Set(facts.map((f) => f.id));
  return { fromMs, toMs, deadlines, deadlinesMs, rows: reviewCandidates(facts, deadlinesMs, req.nowMs), curves: curves.filter((c) => kept.has(c.candidateId)) };
}

/** Everything the review page draws (built by lib/services/build-review.ts). */
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
  /** coverage curves (probability observed against time since merger) of the candidates in scope that have them */
  curves: ReviewCurve[];
}
