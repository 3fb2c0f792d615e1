import { and, asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db";
import {
  candidateRevisions,
  candidates,
  derivedQuantities,
  followUpTasks,
  sites,
  triggers,
  type SourceClass,
  type Stage,
  type TaskKind,
  type TaskState,
  type TriageState,
} from "@/db/schema";
import { diffHeadlines, headlineFromDerived, type HeadlineChange, type RevisionHeadline } from "./headline";
import { loadPeople, type PersonRef } from "./candidates";

export type { PersonRef } from "./candidates";

export interface CandidateRevisionSummary {
  revision: number;
  stage: Stage;
  eventTime: Date;
  receivedAt: Date;
  isCurrent: boolean;
  /** a higher revision had already arrived when this one did */
  arrivedLate: boolean;
  headline: RevisionHeadline;
  /** what changed since the next lower revision (empty for the first) */
  changes: HeadlineChange[];
}

export interface CandidateTaskSummary {
  id: string;
  kind: TaskKind;
  state: TaskState;
  priority: number;
  site: { id: string; code: string; name: string } | null;
  claimedBy: PersonRef | null;
  windowStart: Date | null;
  windowEnd: Date | null;
  createdAt: Date;
  claimedAt: Date | null;
  reportedAt: Date | null;
  cancelledAt: Date | null;
}

/** One pipeline's report of this signal, as `GET /api/v1/candidates/{id}` lists it. */
export interface CandidateTriggerSummary {
  id: string;
  source: string;
  externalId: string;
  revision: number;
  eventTime: Date;
  networkSnr: number;
  falseAlarmRatePerYear: number;
  preferred: boolean;
  receivedAt: Date;
  stage: Stage;
  withdrawnAt: Date | null;
  chirpMassDetectorFrame: number | null;
  detectors: string[];
}

export interface CandidateDetail {
  id: string;
  /** the current revision number */
  revision: number;
  /** the current revision's derived quantities, as the ingest route answered them */
  derived: Record<string, unknown>;
  source: string;
  externalId: string;
  state: {
    triageState: TriageState;
    stage: Stage;
    owner: PersonRef | null;
    acknowledgedAt: Date | null;
    acknowledgedBy: PersonRef | null;
    decidedAt: Date | null;
    dismissReason: string | null;
    withdrawnAt: Date | null;
    eventTime: Date;
    receivedAt: Date;
    updatedAt: Date;
    version: number;
  };
  headline: {
    networkSnr: number;
    falseAlarmRatePerYear: number;
    detectors: string[];
    chirpMassDetectorFrame: number | null;
    dominantClass: SourceClass | null;
  };
  /** the preferred trigger's revisions */
  revisions: CandidateRevisionSummary[];
  /** every trigger grouped into this candidate, first received first */
  triggers: CandidateTriggerSummary[];
  /** set when a coordinator merged this candidate into another (it then has no triggers) */
  mergedIntoId: string | null;
  tasks: CandidateTaskSummary[];
  /** the current revision's feed body as received (validated) */
  payload: Record<string, unknown>;
}

function payloadNumber(payload: Record<string, unknown>, key: string): number {
  const value = payload[key];
  return typeof value === "number" ? value : Number.NaN;
}

/** One candidate with state, every revision (and what changed), tasks and the current payload; null if unknown. */
export async function getCandidateDetail(id: string): Promise<CandidateDetail | null> {
  const db = await getDb();
  const [candidate] = await db.select().from(candidates).where(eq(candidates.id, id)).limit(1);
  if (!candidate) return null;
  const [revisionRows, taskRows, triggerRows] = await Promise.all([
    db
      .select({ revision: candidateRevisions, derived: derivedQuantities.derived })
      .from(candidateRevisions)
      .leftJoin(derivedQuantities, eq(derivedQuantities.revisionId, candidateRevisions.id))
      .where(and(eq(candidateRevisions.candidateId, id), eq(candidateRevisions.triggerId, candidate.preferredTriggerId ?? "")))
      .orderBy(asc(candidateRevisions.revision)),
    db
      .select({ task: followUpTasks, site: { id: sites.id, code: sites.code, name: sites.name } })
      .from(followUpTasks)
      .leftJoin(sites, eq(sites.id, followUpTasks.siteId))
      .where(eq(followUpTasks.candidateId, id))
      .orderBy(asc(followUpTasks.createdAt)),
    db.select().from(triggers).where(eq(triggers.candidateId, id)).orderBy(asc(triggers.receivedAt), sql`rowid`),
  ]);
  const people = await loadPeople([
    candidate.ownerId,
    candidate.acknowledgedById,
    ...taskRows.map((row) => row.task.claimedById),
  ]);
  const person = (userId: string | null) => (userId ? (people.get(userId) ?? null) : null);

  const revisions: CandidateRevisionSummary[] = [];
  let previous: RevisionHeadline | null = null;
  for (const [index, { revision, derived }] of revisionRows.entries()) {
    const derivedHeadline = headlineFromDerived(derived);
    const headline: RevisionHeadline = {
      stage: revision.stage,
      eventTime: revision.eventTime.toISOString(),
      networkSnr: payloadNumber(revision.payload, "networkSnr"),
      falseAlarmRatePerYear: payloadNumber(revision.payload, "falseAlarmRatePerYear"),
      detectors: Array.isArray(revision.payload.detectors) ? revision.payload.detectors.map(String) : [],
      chirpMassDetectorFrame: derivedHeadline.chirpMassDetectorFrame,
      dominantClass: derivedHeadline.dominantClass,
    };
    const later = revisionRows.slice(index + 1);
    revisions.push({
      revision: revision.revision,
      stage: revision.stage,
      eventTime: revision.eventTime,
      receivedAt: revision.receivedAt,
      isCurrent: revision.revision === candidate.currentRevision,
      arrivedLate: later.some((row) => row.revision.receivedAt < revision.receivedAt),
      headline,
      changes: previous ? diffHeadlines(previous, headline) : [],
    });
    previous = headline;
  }
  const current = revisionRows.find((row) => row.revision.revision === candidate.currentRevision);

  return {
    id: candidate.id,
    revision: candidate.currentRevision,
    derived: current?.derived ?? {},
    source: candidate.source,
    externalId: candidate.externalId,
    state: {
      triageState: candidate.triageState,
      stage: candidate.stage,
      owner: person(candidate.ownerId),
      acknowledgedAt: candidate.acknowledgedAt,
      acknowledgedBy: person(candidate.acknowledgedById),
      decidedAt: candidate.decidedAt,
      dismissReason: candidate.dismissReason,
      withdrawnAt: candidate.withdrawnAt,
      eventTime: candidate.eventTime,
      receivedAt: candidate.receivedAt,
      updatedAt: candidate.updatedAt,
      version: candidate.version,
    },
    headline: {
      networkSnr: candidate.networkSnr,
      falseAlarmRatePerYear: candidate.falseAlarmRatePerYear,
      detectors: candidate.detectors,
      chirpMassDetectorFrame: candidate.chirpMassDetectorFrame,
      dominantClass: candidate.dominantClass,
    },
    revisions,
    triggers: triggerRows.map((t) => ({
      id: t.id,
      source: t.source,
      externalId: t.externalId,
      revision: t.currentRevision,
      eventTime: t.eventTime,
      networkSnr: t.networkSnr,
      falseAlarmRatePerYear: t.falseAlarmRatePerYear,
      preferred: t.id === candidate.preferredTriggerId,
      receivedAt: t.receivedAt,
      stage: t.stage,
      withdrawnAt: t.withdrawnAt,
      chirpMassDetectorFrame: t.chirpMassDetectorFrame,
      detectors: t.detectors,
    })),
    mergedIntoId: candidate.mergedIntoId,
    tasks: taskRows.map(({ task, site }) => ({
      id: task.id,
      kind: task.kind,
      state: task.state,
      priority: task.priority,
      site: site ?? null,
      claimedBy: person(task.claimedById),
      windowStart: task.windowStart,
      windowEnd: task.windowEnd,
      createdAt: task.createdAt,
      claimedAt: task.claimedAt,
      reportedAt: task.reportedAt,
      cancelledAt: task.cancelledAt,
    })),
    payload: current?.revision.payload ?? {},
  };
}

