import type { CandidateColumns, CandidateFacts, DecisionState } from "./timeline";

/** A first occurrence in the audit log: when, and who. */
export interface Stamp {
  atMs: number;
  actorId: string | null;
}

/** One row of the review's query (times in Unix ms): the candidate's columns and its first milestones in the log. */
export interface CandidateMilestones extends CandidateColumns {
  acknowledgedAtMs: number | null;
  acknowledgedById: string | null;
  decidedAtMs: number | null;
  /** first page (or escalated page) sent by push or e-mail, from the outbox */
  firstPageAtMs: number | null;
  /** first triage move out of "new" */
  leftNew: Stamp | null;
  /** first move into pursue / dismissed / expert */
  firstDecision: (Stamp & { state: DecisionState }) | null;
  firstPursueAtMs: number | null;
  /** first task.state-changed to "claimed" of any of its (counted) tasks */
  firstClaim: Stamp | null;
  /** first task.reported of any of its (counted) tasks */
  firstReport: Stamp | null;
  taskCount: number;
  cancelledTaskCount: number;
}

const decisions: readonly string[] = ["pursue", "dismissed", "expert"];
const earlier = (a: Stamp | null, b: Stamp | null): Stamp | null => (a === null ? b : b === null || a.atMs <= b.atMs ? a : b);
const stamp = (atMs: number | null, actorId: string | null): Stamp | null => (atMs === null ? null : { atMs, actorId });

/**
 * The facts the timeline needs, taking the earlier of the audit log and the table columns for the acknowledgement
 * and the decision (a column can be overwritten by a later change; the log keeps the first). Claims and reports
 * come from the log alone: releasing a claim clears the task's claimedAt.
 */
export function factsOf(m: CandidateMilestones): CandidateFacts {
  let decision = m.firstDecision;
  if (m.decidedAtMs !== null && decisions.includes(m.triageState) && (decision === null || m.decidedAtMs < decision.atMs)) {
    decision = { atMs: m.decidedAtMs, actorId: null, state: m.triageState as DecisionState };
  }
  // A decision taken straight from "new" is also the acknowledgement.
  const ack = earlier(earlier(stamp(m.acknowledgedAtMs, m.acknowledgedById), m.leftNew), decision);
  let pursueAtMs = m.firstPursueAtMs;
  if (m.triageState === "pursue" && m.decidedAtMs !== null && (pursueAtMs === null || m.decidedAtMs < pursueAtMs)) pursueAtMs = m.decidedAtMs;
  return {
    id: m.id,
    source: m.source,
    externalId: m.externalId,
    stage: m.stage,
    dominantClass: m.dominantClass,
    triageState: m.triageState,
    ownerId: m.ownerId,
    eventTimeMs: m.eventTimeMs,
    receivedAtMs: m.receivedAtMs,
    withdrawnAtMs: m.withdrawnAtMs,
    firstPageAtMs: m.firstPageAtMs,
    acknowledgedAtMs: ack?.atMs ?? null,
    acknowledgedById: ack?.actorId ?? null,
    firstDecisionAtMs: decision?.atMs ?? null,
    firstDecision: decision?.state ?? null,
    decidedById: decision?.actorId ?? null,
    firstPursueAtMs: pursueAtMs,
    firstClaimAtMs: m.firstClaim?.atMs ?? null,
    claimedById: m.firstClaim?.actorId ?? null,
    firstReportAtMs: m.firstReport?.atMs ?? null,
    reportedById: m.firstReport?.actorId ?? null,
    taskCount: m.taskCount,
    cancelledTaskCount: m.cancelledTaskCount,
  };
}

/** Did this person finish any step of the candidate, or own it? (the review's person filter) */
export function involves(f: CandidateFacts, personId: string): boolean {
  return [f.ownerId, f.acknowledgedById, f.decidedById, f.claimedById, f.reportedById].includes(personId);
}
