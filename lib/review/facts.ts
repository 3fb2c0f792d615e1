import type { CandidateFacts, DecisionState } from "./timeline";

/** Rows as the review's range queries return them (times in Unix ms). */
export interface CandidateRow {
  id: string;
  source: string;
  externalId: string;
  stage: string;
  dominantClass: string | null;
  triageState: string;
  ownerId: string | null;
  eventTimeMs: number;
  receivedAtMs: number;
  withdrawnAtMs: number | null;
  acknowledgedAtMs: number | null;
  acknowledgedById: string | null;
  decidedAtMs: number | null;
}
export interface PageRow {
  candidateId: string;
  firstSentAtMs: number;
}
export interface TriageEventRow {
  candidateId: string;
  atMs: number;
  fromState: string | null;
  toState: string | null;
  actorId: string | null;
}
/** The first claim or first report of any of a candidate's tasks, with who did it. */
export interface MilestoneRow {
  candidateId: string;
  atMs: number;
  actorId: string | null;
}
export interface TaskCountRow {
  candidateId: string;
  taskCount: number;
  cancelledCount: number;
}

const decisions: readonly string[] = ["pursue", "dismissed", "expert"];

interface Stamp {
  atMs: number;
  actorId: string | null;
}
const earlier = (a: Stamp | null, b: Stamp | null): Stamp | null => (a === null ? b : b === null || a.atMs <= b.atMs ? a : b);
const stamp = (atMs: number | null, actorId: string | null): Stamp | null => (atMs === null ? null : { atMs, actorId });

interface TriageFirsts {
  leftNew: Stamp | null;
  decision: (Stamp & { state: DecisionState }) | null;
  pursue: Stamp | null;
}

/**
 * One pass over each row set: the first acknowledgement, decision, pursue, claim and report per candidate, taking
 * the earlier of the audit log and the table columns (a column can be overwritten by a later change; the log
 * keeps the first). Claims and reports come from the log alone: releasing a claim clears the task's claimedAt.
 * With `siteOnly`, the task rows were already limited to one site and candidates without a task there drop out.
 */
export function buildFacts(
  input: {
    candidates: readonly CandidateRow[];
    pages: readonly PageRow[];
    triageEvents: readonly TriageEventRow[];
    taskCounts: readonly TaskCountRow[];
    claims: readonly MilestoneRow[];
    reports: readonly MilestoneRow[];
  },
  options: { siteOnly?: boolean } = {},
): CandidateFacts[] {
  const firstPage = new Map(input.pages.map((p) => [p.candidateId, p.firstSentAtMs]));

  const triage = new Map<string, TriageFirsts>();
  for (const e of input.triageEvents) {
    let t = triage.get(e.candidateId);
    if (!t) {
      t = { leftNew: null, decision: null, pursue: null };
      triage.set(e.candidateId, t);
    }
    const s = { atMs: e.atMs, actorId: e.actorId };
    if (e.fromState === "new" && e.toState !== "new") t.leftNew = earlier(t.leftNew, s);
    if (e.toState && decisions.includes(e.toState) && (t.decision === null || e.atMs < t.decision.atMs)) {
      t.decision = { ...s, state: e.toState as DecisionState };
    }
    if (e.toState === "pursue") t.pursue = earlier(t.pursue, s);
  }

  const taskCounts = new Map(input.taskCounts.map((t) => [t.candidateId, t]));
  const claims = new Map(input.claims.map((m) => [m.candidateId, m]));
  const reports = new Map(input.reports.map((m) => [m.candidateId, m]));

  const out: CandidateFacts[] = [];
  for (const c of input.candidates) {
    const counts = taskCounts.get(c.id);
    if (options.siteOnly && !counts) continue;
    const t = triage.get(c.id);

    let decision: (Stamp & { state: DecisionState }) | null = t?.decision ?? null;
    if (c.decidedAtMs !== null && decisions.includes(c.triageState) && (decision === null || c.decidedAtMs < decision.atMs)) {
      decision = { atMs: c.decidedAtMs, actorId: null, state: c.triageState as DecisionState };
    }
    // A decision taken straight from "new" is also the acknowledgement.
    const ack = earlier(earlier(stamp(c.acknowledgedAtMs, c.acknowledgedById), t?.leftNew ?? null), decision);
    let pursue = t?.pursue ?? null;
    if (c.triageState === "pursue") pursue = earlier(pursue, stamp(c.decidedAtMs, null));

    const claim = claims.get(c.id) ?? null;
    const report = reports.get(c.id) ?? null;

    out.push({
      id: c.id,
      source: c.source,
      externalId: c.externalId,
      stage: c.stage,
      dominantClass: c.dominantClass,
      triageState: c.triageState,
      ownerId: c.ownerId,
      eventTimeMs: c.eventTimeMs,
      receivedAtMs: c.receivedAtMs,
      withdrawnAtMs: c.withdrawnAtMs,
      firstPageAtMs: firstPage.get(c.id) ?? null,
      acknowledgedAtMs: ack?.atMs ?? null,
      acknowledgedById: ack?.actorId ?? null,
      firstDecisionAtMs: decision?.atMs ?? null,
      firstDecision: decision?.state ?? null,
      decidedById: decision?.actorId ?? null,
      firstPursueAtMs: pursue?.atMs ?? null,
      firstClaimAtMs: claim?.atMs ?? null,
      claimedById: claim?.actorId ?? null,
      firstReportAtMs: report?.atMs ?? null,
      reportedById: report?.actorId ?? null,
      taskCount: counts?.taskCount ?? 0,
      cancelledTaskCount: counts?.cancelledCount ?? 0,
    });
  }
  return out;
}

/** Did this person finish any step of the candidate, or own it? (the review's person filter) */
export function involves(f: CandidateFacts, personId: string): boolean {
  return [f.ownerId, f.acknowledgedById, f.decidedById, f.claimedById, f.reportedById].includes(personId);
}
