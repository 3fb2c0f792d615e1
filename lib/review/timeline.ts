import type { StepId } from "./steps";
import type { CandidateColumns, DecisionState } from "@/lib/data/review";

export type { CandidateColumns, DecisionState } from "@/lib/data/review";

/**
 * What the audit log, the candidates table and the outbox say about one candidate, reduced to first times
 * (Unix ms). Built from lib/data/review.ts's one query by facts.ts; everything here is pure.
 */
export interface CandidateFacts extends CandidateColumns {
  firstPageAtMs: number | null;
  /** the first move out of "new" (an acknowledgement, or a decision taken straight from new) */
  acknowledgedAtMs: number | null;
  acknowledgedById: string | null;
  firstDecisionAtMs: number | null;
  firstDecision: DecisionState | null;
  decidedById: string | null;
  firstPursueAtMs: number | null;
  firstClaimAtMs: number | null;
  claimedById: string | null;
  firstReportAtMs: number | null;
  reportedById: string | null;
  taskCount: number;
  cancelledTaskCount: number;
  /** the first logged exposure's start and who logged it (lib/review/coverage-facts.ts) */
  firstExposureAtMs: number | null;
  firstExposureById: string | null;
  /** end of the exposure that took the observed probability of the newest sky map to 50 % / 90 %; null if never */
  covered50AtMs: number | null;
  covered90AtMs: number | null;
  hasSkymap: boolean;
}

/**
 * done: both ends reached; open: started, not ended (duration = time so far); waiting: an earlier step is still
 * open; skipped: will not happen (acknowledged before any page went out, dismissed so no follow-up, withdrawn,
 * every task cancelled).
 */
export type StepStatus = "done" | "open" | "waiting" | "skipped";

export interface StepTiming {
  step: StepId;
  status: StepStatus;
  startMs: number | null;
  endMs: number | null;
  /** end − start when done; now − start when open; null otherwise */
  durationMs: number | null;
  /** who finished the step (acknowledged, decided, claimed, reported) */
  actorId: string | null;
  /** why a step is skipped, in a few words */
  note: string | null;
  /** done and took longer than its deadline, or open and already past it (set by evaluate.ts) */
  overDeadline: boolean;
}

// Every timing has the same fields in the same order: one object shape keeps the year-long review fast.
const timing = (
  step: StepId,
  status: StepStatus,
  startMs: number | null,
  endMs: number | null,
  durationMs: number | null,
  actorId: string | null,
  note: string | null,
): StepTiming => ({ step, status, startMs, endMs, durationMs, actorId, note, overDeadline: false });
const done = (step: StepId, startMs: number, endMs: number, actorId: string | null = null) =>
  timing(step, "done", startMs, endMs, endMs - startMs, actorId, null);
const waiting = (step: StepId) => timing(step, "waiting", null, null, null, null, null);
const skipped = (step: StepId, note: string, startMs: number | null = null) =>
  timing(step, "skipped", startMs, null, null, null, note);

/** A started step that has not ended: open, unless the candidate was withdrawn or its tasks all cancelled. */
function unfinished(step: StepId, f: CandidateFacts, startMs: number, nowMs: number, tasksMatter: boolean): StepTiming {
  if (f.withdrawnAtMs !== null) return skipped(step, "withdrawn", startMs);
  if (tasksMatter && f.taskCount > 0 && f.cancelledTaskCount === f.taskCount) return skipped(step, "all tasks cancelled", startMs);
  return timing(step, "open", startMs, null, Math.max(0, nowMs - startMs), null, null);
}

/** The nine step timings of one candidate, relative to `nowMs` for open steps. */
export function candidateSteps(f: CandidateFacts, nowMs: number): StepTiming[] {
  const receipt = f.receivedAtMs;
  const ack = f.acknowledgedAtMs;
  // A page that went out after the acknowledgement did not drive it.
  const pageCounts = f.firstPageAtMs !== null && (ack === null || f.firstPageAtMs <= ack);

  const feed = done("feed", f.eventTimeMs, receipt);

  let page: StepTiming;
  if (pageCounts && f.firstPageAtMs !== null) page = done("page", receipt, f.firstPageAtMs);
  else if (ack !== null) page = skipped("page", "acknowledged before any page was sent", receipt);
  else page = unfinished("page", f, receipt, nowMs, false);

  let acknowledge: StepTiming;
  const ackStart = pageCounts && f.firstPageAtMs !== null ? f.firstPageAtMs : receipt;
  if (ack !== null) acknowledge = done("acknowledge", ackStart, ack, f.acknowledgedById);
  else if (page.status === "done") acknowledge = unfinished("acknowledge", f, ackStart, nowMs, false);
  else acknowledge = page.status === "skipped" ? skipped("acknowledge", page.note ?? "") : waiting("acknowledge");

  let decide: StepTiming;
  if (ack !== null && f.firstDecisionAtMs !== null) decide = done("decide", ack, f.firstDecisionAtMs, f.decidedById);
  else if (ack !== null) decide = unfinished("decide", f, ack, nowMs, false);
  else decide = acknowledge.status === "skipped" ? skipped("decide", acknowledge.note ?? "") : waiting("decide");

  const claim = claimStep(f, decide, nowMs);

  let report: StepTiming;
  if (f.firstClaimAtMs !== null && f.firstReportAtMs !== null) {
    report = done("report", f.firstClaimAtMs, f.firstReportAtMs, f.reportedById);
  } else if (f.firstClaimAtMs !== null) report = unfinished("report", f, f.firstClaimAtMs, nowMs, true);
  else report = claim.status === "skipped" ? skipped("report", claim.note ?? "") : waiting("report");

  return [
    feed,
    page,
    acknowledge,
    decide,
    claim,
    report,
    coverageStep("exposure", f, f.firstExposureAtMs, f.firstExposureById, false, decide, nowMs),
    coverageStep("covered50", f, f.covered50AtMs, null, true, decide, nowMs),
    coverageStep("covered90", f, f.covered90AtMs, null, true, decide, nowMs),
  ];
}

/**
 * A step from the merger to an observing milestone. It is open once follow-up began (a pursue decision, a task or
 * a claim) until the milestone; coverage steps are skipped when there is no sky map to measure on, and every one
 * when the candidate was decided without follow-up.
 */
function coverageStep(
  step: StepId,
  f: CandidateFacts,
  endMs: number | null,
  actorId: string | null,
  needsMap: boolean,
  decide: StepTiming,
  nowMs: number,
): StepTiming {
  if (endMs !== null) return done(step, f.eventTimeMs, endMs, actorId);
  const followUp = f.firstPursueAtMs !== null || f.taskCount > 0 || f.firstClaimAtMs !== null;
  if (followUp && needsMap && !f.hasSkymap) return skipped(step, "no sky map", f.eventTimeMs);
  if (followUp) return unfinished(step, f, f.eventTimeMs, nowMs, true);
  if (decide.status === "done") return skipped(step, `decided ${f.firstDecision ?? "without follow-up"}`);
  return decide.status === "skipped" ? skipped(step, decide.note ?? "") : waiting(step);
}

function claimStep(f: CandidateFacts, decide: StepTiming, nowMs: number): StepTiming {
  // The claim clock starts at the first "pursue"; a candidate with tasks but no pursue starts at its first decision.
  const start = f.firstPursueAtMs ?? (f.taskCount > 0 || f.firstClaimAtMs !== null ? f.firstDecisionAtMs : null);
  if (start !== null && f.firstClaimAtMs !== null) return done("claim", start, f.firstClaimAtMs, f.claimedById);
  if (start !== null) return unfinished("claim", f, start, nowMs, true);
  if (decide.status === "done") return skipped("claim", `decided ${f.firstDecision ?? "without follow-up"}`);
  return decide.status === "skipped" ? skipped("claim", decide.note ?? "") : waiting("claim");
}
