import { and, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { candidateRevisions, candidates, derivedQuantities, followUpTasks, type Candidate } from "@/db/schema";
import { headlineFromDerived, diffHeadlines, type DerivedHeadline, type RevisionHeadline } from "@/lib/feed/headline";
import { derivationSeed, revisionHeadline, toPhysicsInput } from "@/lib/feed/physics-input";
import { eventKinds } from "@/lib/events/kinds";
import { createGroupCommitter } from "@/lib/feed/group-commit";
import { onCandidateIngested, onTasksCancelled } from "@/lib/notify/hooks";
import { computeDerived } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";
import { appendEvent, type Tx } from "./events";
import { getSetting } from "./settings";

/** created: a new candidate; revised: a new current revision; stale: kept in history only; duplicate: seen before. */
export type IngestOutcome = "created" | "revised" | "stale" | "duplicate";

export interface IngestAnswer {
  id: string;
  revision: number;
  derived: Record<string, unknown>;
}

export interface IngestResult {
  status: 200 | 201;
  outcome: IngestOutcome;
  answer: IngestAnswer;
}

const openTaskStates = ["open", "claimed", "observing"] as const;
const withdrawalReason = "the feed withdrew the candidate";

/**
 * Stores one validated feed revision: candidate, revision, derived quantities, events and paging hooks in one
 * write transaction (its own savepoint inside a group commit). Idempotent on (source, externalId, revision): a
 * repeat answers the stored result, writing nothing. The physics runs first, so the write lock is held only for
 * the writes.
 */
export async function ingestCandidate(payload: FeedCandidate, receivedAt: Date): Promise<IngestResult> {
  const db = await getDb();
  const stored = await findStoredAnswer(db, payload);
  if (stored) return { status: 200, outcome: "duplicate", answer: stored };
  const settings = await getSetting("physics");
  const computed = computeDerived(toPhysicsInput(payload, receivedAt), settings, derivationSeed(payload));
  const derived = computed as unknown as Record<string, unknown>;
  for (let attempt = 1; ; attempt++) {
    try {
      return await writeInGroup({ payload, derived, receivedAt });
    } catch (error) {
      if (!isUniqueViolation(error) || attempt >= 3) throw error;
      // Another process stored this candidate or revision between our read and our write: read again.
      const again = await findStoredAnswer(db, payload);
      if (again) return { status: 200, outcome: "duplicate", answer: again };
    }
  }
}

interface PendingRevision {
  payload: FeedCandidate;
  derived: Record<string, unknown>;
  receivedAt: Date;
}

// One writer per module instance; concurrent posts share a commit (see lib/feed/group-commit.ts).
const writeInGroup = createGroupCommitter<PendingRevision, IngestResult>((tx, pending) =>
  writeRevision(tx, pending.payload, pending.derived, pending.receivedAt),
);

/** The stored answer for (source, externalId, revision), or null. */
export async function findStoredAnswer(q: Tx, payload: Pick<FeedCandidate, "source" | "externalId" | "revision">) {
  const [row] = await q
    .select({ id: candidates.id, derived: derivedQuantities.derived })
    .from(candidates)
    .innerJoin(
      candidateRevisions,
      and(eq(candidateRevisions.candidateId, candidates.id), eq(candidateRevisions.revision, payload.revision)),
    )
    .leftJoin(derivedQuantities, eq(derivedQuantities.revisionId, candidateRevisions.id))
    .where(and(eq(candidates.source, payload.source), eq(candidates.externalId, payload.externalId)))
    .limit(1);
  return row ? { id: row.id, revision: payload.revision, derived: row.derived ?? {} } : null;
}

async function writeRevision(
  tx: Tx,
  payload: FeedCandidate,
  derived: Record<string, unknown>,
  at: Date,
): Promise<IngestResult> {
  // Inside the write transaction nobody else can write, so this read decides for good.
  const stored = await findStoredAnswer(tx, payload);
  if (stored) return { status: 200, outcome: "duplicate", answer: stored };
  const [existing] = await tx
    .select()
    .from(candidates)
    .where(and(eq(candidates.source, payload.source), eq(candidates.externalId, payload.externalId)))
    .limit(1);
  const headline = headlineFromDerived(derived);
  let outcome: IngestOutcome;
  let candidateId: string;
  if (!existing) {
    candidateId = await createCandidate(tx, payload, headline, at);
    outcome = "created";
  } else if (payload.revision > existing.currentRevision) {
    candidateId = existing.id;
    await reviseCandidate(tx, existing, payload, headline, at);
    outcome = "revised";
  } else {
    candidateId = existing.id;
    outcome = "stale";
  }
  await insertRevision(tx, candidateId, payload, derived, headline, at);
  if (outcome === "stale" && existing) {
    await appendEvent(tx, {
      at,
      kind: eventKinds.candidateRevisionStale,
      candidateId,
      data: { revision: payload.revision, current: existing.currentRevision, stage: payload.stage },
    });
  }
  return { status: 201, outcome, answer: { id: candidateId, revision: payload.revision, derived } };
}

async function insertRevision(
  tx: Tx,
  candidateId: string,
  payload: FeedCandidate,
  derived: Record<string, unknown>,
  headline: DerivedHeadline,
  at: Date,
): Promise<void> {
  const [revision] = await tx
    .insert(candidateRevisions)
    .values({
      candidateId,
      revision: payload.revision,
      stage: payload.stage,
      eventTime: new Date(payload.eventTime),
      receivedAt: at,
      payload: payload as unknown as Record<string, unknown>,
    })
    .returning({ id: candidateRevisions.id });
  if (!revision) throw new Error("revision insert returned nothing");
  await tx.insert(derivedQuantities).values({
    revisionId: revision.id,
    chirpMassDetectorFrame: headline.chirpMassDetectorFrame,
    chirpMassDetectorFrameSd: headline.chirpMassDetectorFrameSd,
    pBns: headline.pBns,
    pNsbh: headline.pNsbh,
    pBbh: headline.pBbh,
    pLowerGap: headline.pLowerGap,
    redshift: headline.redshift,
    derived,
    computedAt: at,
  });
}

/** The small card the board needs, carried in the event so a live board draws it without another read. */
function cardData(payload: FeedCandidate, headline: DerivedHeadline) {
  return {
    source: payload.source,
    externalId: payload.externalId,
    revision: payload.revision,
    stage: payload.stage,
    eventTime: new Date(payload.eventTime).toISOString(),
    networkSnr: payload.networkSnr,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    detectors: payload.detectors,
    chirpMassDetectorFrame: headline.chirpMassDetectorFrame,
    dominantClass: headline.dominantClass,
  };
}

function headlineColumns(payload: FeedCandidate, headline: DerivedHeadline) {
  return {
    stage: payload.stage,
    eventTime: new Date(payload.eventTime),
    networkSnr: payload.networkSnr,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    detectors: payload.detectors,
    chirpMassDetectorFrame: headline.chirpMassDetectorFrame,
    dominantClass: headline.dominantClass,
  };
}

async function createCandidate(tx: Tx, payload: FeedCandidate, headline: DerivedHeadline, at: Date): Promise<string> {
  const withdrawn = payload.stage === "withdrawn";
  const [row] = await tx
    .insert(candidates)
    .values({
      source: payload.source,
      externalId: payload.externalId,
      currentRevision: payload.revision,
      triageState: "new",
      receivedAt: at,
      updatedAt: at,
      withdrawnAt: withdrawn ? at : null,
      ...headlineColumns(payload, headline),
    })
    .returning({ id: candidates.id });
  if (!row) throw new Error("candidate insert returned nothing");
  const event = await appendEvent(tx, {
    at,
    kind: eventKinds.candidateCreated,
    candidateId: row.id,
    toState: "new",
    data: { ...cardData(payload, headline), triageState: "new", receivedAt: at.toISOString() },
  });
  await onCandidateIngested(tx, {
    candidateId: row.id,
    eventId: event.id,
    revision: payload.revision,
    stage: payload.stage,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    isNewCandidate: true,
    receivedAt: at,
  });
  if (withdrawn) await withdrawCandidate(tx, row.id, payload.revision, at);
  return row.id;
}

function headlineOfCandidate(row: Candidate): RevisionHeadline {
  return {
    stage: row.stage,
    eventTime: row.eventTime.toISOString(),
    networkSnr: row.networkSnr,
    falseAlarmRatePerYear: row.falseAlarmRatePerYear,
    detectors: row.detectors,
    chirpMassDetectorFrame: row.chirpMassDetectorFrame,
    dominantClass: row.dominantClass,
  };
}

async function reviseCandidate(
  tx: Tx,
  existing: Candidate,
  payload: FeedCandidate,
  headline: DerivedHeadline,
  at: Date,
): Promise<void> {
  const withdrawn = payload.stage === "withdrawn";
  await tx
    .update(candidates)
    .set({
      currentRevision: payload.revision,
      updatedAt: at,
      // A later revision that is not a withdrawal reinstates a withdrawn candidate.
      withdrawnAt: withdrawn ? (existing.withdrawnAt ?? at) : null,
      version: sql`${candidates.version} + 1`,
      ...headlineColumns(payload, headline),
    })
    .where(eq(candidates.id, existing.id));
  const changes = diffHeadlines(headlineOfCandidate(existing), revisionHeadline(payload, headline));
  const event = await appendEvent(tx, {
    at,
    kind: eventKinds.candidateRevised,
    candidateId: existing.id,
    data: { ...cardData(payload, headline), previousRevision: existing.currentRevision, changes },
  });
  await onCandidateIngested(tx, {
    candidateId: existing.id,
    eventId: event.id,
    revision: payload.revision,
    stage: payload.stage,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    isNewCandidate: false,
    receivedAt: at,
  });
  if (withdrawn && !existing.withdrawnAt) await withdrawCandidate(tx, existing.id, payload.revision, at);
}

/** Cancels the candidate's unfinished follow-up tasks, one event each, and tells paging who held them. */
async function withdrawCandidate(tx: Tx, candidateId: string, revision: number, at: Date): Promise<void> {
  const tasks = await tx
    .select({ id: followUpTasks.id, state: followUpTasks.state, ownerId: followUpTasks.claimedById })
    .from(followUpTasks)
    .where(and(eq(followUpTasks.candidateId, candidateId), inArray(followUpTasks.state, openTaskStates)));
  if (tasks.length > 0) {
    await tx
      .update(followUpTasks)
      .set({ state: "cancelled", cancelledAt: at, updatedAt: at, version: sql`${followUpTasks.version} + 1` })
      .where(inArray(followUpTasks.id, tasks.map((task) => task.id)));
  }
  const withdrawnEvent = await appendEvent(tx, {
    at,
    kind: eventKinds.candidateWithdrawn,
    candidateId,
    toState: "withdrawn",
    data: { revision, cancelledTaskIds: tasks.map((task) => task.id) },
  });
  for (const task of tasks) {
    await appendEvent(tx, {
      at,
      kind: eventKinds.taskCancelled,
      candidateId,
      taskId: task.id,
      fromState: task.state,
      toState: "cancelled",
      data: { reason: withdrawalReason, ownerId: task.ownerId },
    });
  }
  if (tasks.length === 0) return;
  const ownerIds = [...new Set(tasks.flatMap((task) => (task.ownerId ? [task.ownerId] : [])))];
  await onTasksCancelled(tx, {
    candidateId,
    eventId: withdrawnEvent.id,
    ownerIds,
    taskIds: tasks.map((task) => task.id),
    reason: withdrawalReason,
  });
}

/** The error and its causes as text, codes included (drizzle wraps the driver's error). */
function describeChain(error: unknown): string {
  const parts: string[] = [];
  for (let e = error; e && parts.length < 5; e = (e as { cause?: unknown }).cause) {
    parts.push(`${String(e)} ${String((e as { code?: unknown }).code ?? "")}`);
  }
  return parts.join(" | ");
}

export function isUniqueViolation(error: unknown): boolean {
  return /UNIQUE constraint failed|SQLITE_CONSTRAINT_(UNIQUE|PRIMARYKEY)/.test(describeChain(error));
}

export function isDatabaseBusy(error: unknown): boolean {
  return /SQLITE_BUSY|database is locked/.test(describeChain(error));
}
