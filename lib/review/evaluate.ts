import { candidateSteps, type CandidateFacts, type StepTiming } from "./timeline";
import type { StepId } from "./steps";

export type EvaluatedStep = StepTiming;

export interface CandidateReview {
  facts: CandidateFacts;
  steps: Record<StepId, EvaluatedStep>;
}

/** A step's deadline applies to its own duration; waiting and skipped steps are never late. */
export function isOverDeadline(timing: Pick<StepTiming, "status" | "durationMs">, deadlineMs: number): boolean {
  if (timing.durationMs === null) return false;
  return (timing.status === "done" || timing.status === "open") && timing.durationMs > deadlineMs;
}

/** Step timings and deadline flags for each candidate; deadlines are read at call time, never stored. */
export function reviewCandidates(
  facts: readonly CandidateFacts[],
  deadlinesMs: Record<StepId, number>,
  nowMs: number,
): CandidateReview[] {
  return facts.map((f) => {
    const timings = candidateSteps(f, nowMs);
    const steps = {} as Record<StepId, EvaluatedStep>;
    for (const t of timings) {
      t.overDeadline = isOverDeadline(t, deadlinesMs[t.step]);
      steps[t.step] = t;
    }
    return { facts: f, steps };
  });
}
