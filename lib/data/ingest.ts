import { randomUUID } from "node:crypto";
import type { Transaction } from "@libsql/client";
import { and, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { candidates, followUpTasks, type Candidate } from "@/db/schema";
import type { DerivedForFeed } from "@/lib/feed/derive-messages";
import { derivePool } from "@/lib/feed/derive-pool";
import { createGroupCommitter, type GroupWrite } from "@/lib/feed/group-commit";
import { diffHeadlines, type DerivedHeadline, type RevisionHeadline } from "@/lib/feed/headline";
import { derivationSeed, revisionHeadline, toPhysicsInput } from "@/lib/feed/physics-input";
import { eventKinds } from "@/lib/events/kinds";
import { onCandidateIngested, onTasksCancelled } from "@/lib/notify/hooks";
import type { FeedCandidate } from "@/lib/validations/feed";
import { appendEvent, type Tx } from "./events";
import {
  insertCandidateStatement,
  insertCreatedEventStatement,
  insertDerivedStatement,
  insertRevisionStatement,
  lookupStatement,
  cardData,
  type NewCandidateRow,
} from "./ingest-sql";
import { getSetting } from "./settings";

/** created: a new candidate; revised: a new current revision; stale: kept in history only; duplicate: seen before. */
export type IngestOutcome = "created" | "revised" | "stale" | "duplicate";

export interface IngestResult {
  status: 200 | 201;
  outcome: IngestOutcome;
  id: string;
  revision: number;
  /** the derived quantities as stored: JSON text, so the route answers without serialising them again */
  derivedJson: string;
}

const openTaskStates = ["open", "claimed", "observing"] as const;
const withdrawalReason = "the feed withdrew the candidate";

/**
 * Stores one validated feed revision: candidate, revision, derived quantities, events and paging hooks in one
 * write transaction (its own savepoint inside a group commit). Idempotent on (source, externalId, revision): a
 * repeat answers the stored result, writing nothing. The physics runs first, on a physics thread when there is
 * one (lib/feed/derive-pool.ts), so the write lock is held only for the writes.
 */
export async function ingestCandidate(
  payload: FeedCandidate,
  receivedAt: Date,
  options: {
    /** the payload as JSON text when the caller already has it, e.g. the raw body when validation changed nothing */
    payloadJson?: string;
  } = {},
): Promise<IngestResult> {
  const db = await getDb();
  const stored = await readStoredAnswer(db.$client, payload);
  if (stored) return stored;
  const settings = await getSetting("physics");
  derivationsRunning += 1;
  let derived: DerivedForFeed;
  try {
    derived = await derivePool().run(toPhysicsInput(payload, receivedAt), settings, derivationSeed(payload));
  } finally {
    derivationsRunning -= 1;
  }
  for (let attempt = 1; ; attempt++) {
    try {
      return await writeInGroup({ payload, payloadJson: options.payloadJson, derived, receivedAt });
    } catch (error) {
      if (!isUniqueViolation(error) || attempt >= 3) throw error;
      // Another process stored this candidate or revision between our read and our write: read again.
      const again = await readStoredAnswer(db.$client, payload);
      if (again) return again;
    }
  }
}

interface PendingRevision {
  payload: FeedCandidate;
  payloadJson: string | undefined;
  derived: DerivedForFeed;
  receivedAt: Date;
}

/** Posts whose physics is still running: their writes are on their way to the group commit. */
let derivationsRunning = 0;

/** How long a commit waits for posts still in their physics (bounded; see lib/feed/group-commit.ts). */
const commitGatherMs = 3;

// One writer per module instance; concurrent posts share a commit (see lib/feed/group-commit.ts).
const writeInGroup = createGroupCommitter<PendingRevision, IngestResult>(writeOne, {
  expected: () => derivationsRunning,
  gatherMs: commitGatherMs,
});

async function writeOne(tx: GroupWrite, pending: PendingRevision): Promise<IngestResult> {
  // Inside the write transaction nobody else can write, so this read decides for good.
  const found = (await tx.sql.execute(lookupStatement(pending.payload))).rows[0];
  if (!found) return createCandidate(tx, pending);
  const stored = storedAnswerFrom(found, pending.payload);
  if (stored) return stored;
  return writeRevision(tx, String(found.id), pending);
}

/** The stored rows' fields for this post, for a candidate (new or, with its id, already known). */
function rowFor(pending: PendingRevision, candidateId: string = randomUUID()): NewCandidateRow {
  return {
    candidateId,
    revisionId: randomUUID(),
    payload: pending.payload,
    payloadJson: pending.payloadJson ?? JSON.stringify(pending.payload),
    derivedJson: pending.derived.json,
    headline: pending.derived.headline,
    receivedAtMs: pending.receivedAt.getTime(),
  };
}

type LookupRow = Record<string, unknown>;

function storedAnswerFrom(row: LookupRow, payload: Pick<FeedCandidate, "revision">): IngestResult | null {
  if (row.revision_id === null || row.revision_id === undefined) return null;
  return {
    status: 200,
    outcome: "duplicate",
    id: String(row.id),
    revision: payload.revision,
    derivedJson: typeof row.derived === "string" ? row.derived : "{}",
  };
}

/** The stored answer for (source, externalId, revision) read outside any transaction, or null. */
async function readStoredAnswer(
  client: Pick<Transaction, "execute">,
  payload: Pick<FeedCandidate, "source" | "externalId" | "revision">,
): Promise<IngestResult | null> {
  const row = (await client.execute(lookupStatement(payload))).rows[0];
  return row ? storedAnswerFrom(row, payload) : null;
}

/**
 * A revision of a candidate already stored: a new current revision, or (lower than the current one) history only.
 * The revision and its derived quantities are stored with the same statements as a new candidate's.
 */
async function writeRevision(tx: GroupWrite, candidateId: string, pending: PendingRevision): Promise<IngestResult> {
  const { payload, receivedAt: at } = pending;
  const [existing] = await tx.orm.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!existing) throw new Error("the candidate disappeared inside the write transaction");
  const { headline } = pending.derived;
  const outcome: IngestOutcome = payload.revision > existing.currentRevision ? "revised" : "stale";
  if (outcome === "revised") await reviseCandidate(tx.orm, existing, payload, headline, at);
  const row = rowFor(pending, existing.id);
  await tx.sql.execute(insertRevisionStatement(row));
  await tx.sql.execute(insertDerivedStatement(row));
  if (outcome === "stale") {
    await appendEvent(tx.orm, {
      at,
      kind: eventKinds.candidateRevisionStale,
      candidateId: existing.id,
      data: { revision: payload.revision, current: existing.currentRevision, stage: payload.stage },
    });
  }
  return { status: 201, outcome, id: existing.id, revision: payload.revision, derivedJson: pending.derived.json };
}

function headlineColumns(payload: FeedCandidate, headline: DerivedHeadline) {
  return { ...revisionHeadline(payload, headline), eventTime: new Date(payload.eventTime) };
}

/**
 * A new candidate: the hand-written statements of lib/data/ingest-sql.ts (the hot path of a burst), then the
 * paging hook and, for a candidate withdrawn on its first post, the withdrawal, through Drizzle on the same
 * transaction.
 */
async function createCandidate(tx: GroupWrite, pending: PendingRevision): Promise<IngestResult> {
  const { payload, derived, receivedAt } = pending;
  const row = rowFor(pending);
  await tx.sql.execute(insertCandidateStatement(row));
  const eventId = Number((await tx.sql.execute(insertCreatedEventStatement(row))).rows[0]?.id);
  if (!Number.isSafeInteger(eventId)) throw new Error("event insert returned no id");
  await onCandidateIngested(tx.orm, {
    candidateId: row.candidateId,
    eventId,
    revision: payload.revision,
    stage: payload.stage,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    isNewCandidate: true,
    receivedAt,
    candidate: {
      id: row.candidateId,
      externalId: payload.externalId,
      source: payload.source,
      stage: payload.stage,
      networkSnr: payload.networkSnr,
      falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
      dominantClass: derived.headline.dominantClass,
      detectors: payload.detectors,
    },
  });
  if (payload.stage === "withdrawn") await withdrawCandidate(tx.orm, row.candidateId, payload.revision, receivedAt);
  await tx.sql.execute(insertRevisionStatement(row));
  await tx.sql.execute(insertDerivedStatement(row));
  return { status: 201, outcome: "created", id: row.candidateId, revision: payload.revision, derivedJson: derived.json };
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
