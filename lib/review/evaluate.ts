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

/** Late when acknowledged (or still open) more than the paging + acknowledgement deadlines after receipt. */
export function isAcknowledgementLate(
  timing: Pick<StepTiming, "status" | "durationMs" | "startMs">,
  receivedAtMs: number,
  deadlinesMs: Pick<Record<StepId, number>, "page" | "acknowledge">,
): boolean {
  if (timing.durationMs === null || timing.startMs === null) return false;
  if (timing.status !== "done" && timing.status !== "open") return false;
  return timing.startMs + timing.durationMs - receivedAtMs > deadlinesMs.page + deadlinesMs.acknowledge;
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
    // The acknowledgement deadline is one number from receipt (paging + acknowledgement step), the same as the
    // board's "Overdue": a slow page does not make a prompt acknowledgement late, nor a quick one a late one prompt.
    steps.acknowledge.overDeadline = isAcknowledgementLate(steps.acknowledge, f.receivedAtMs, deadlinesMs);
    return { facts: f, steps };
  });
}
