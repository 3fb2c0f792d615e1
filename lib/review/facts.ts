import { loadCandidateMilestones, type CandidateMilestones, type DecisionState, type ReviewFilters, type Stamp } from "@/lib/data/review";
import type { Tx } from "@/db";
import type { CandidateFacts } from "./timeline";

export type { CandidateMilestones, Stamp } from "@/lib/data/review";

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
    // filled from the observation log by coverage-facts.ts
    firstExposureAtMs: null,
    firstExposureById: null,
    covered50AtMs: null,
    covered90AtMs: null,
    hasSkymap: false,
  };
}

/** Did this person finish any step of the candidate, or own it? (the review's person filter) */
export function involves(f: CandidateFacts, personId: string): boolean {
  return [f.ownerId, f.acknowledgedById, f.decidedById, f.claimedById, f.reportedById, f.firstExposureById].includes(personId);
}

/** Per-candidate facts for the review: storage's milestones, reduced. */
export async function loadCandidateFacts(f: ReviewFilters, nowMs: number, q?: Tx): Promise<CandidateFacts[]> {
  return (await loadCandidateMilestones(f, nowMs, q)).map(factsOf);
}
