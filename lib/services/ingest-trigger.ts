import { randomUUID } from "node:crypto";
import type { Transaction } from "@libsql/client";
import { getDb, isUniqueViolation, type Tx } from "@/db";
import type { Trigger } from "@/db/schema";
import type { DerivedForFeed } from "@/lib/feed/derive-messages";
import { derivePool } from "@/lib/feed/derive-pool";
import { createGroupCommitter, type GroupWrite } from "@/db/group-commit";
import { diffHeadlines, revisionHeadline, type DerivedHeadline, type RevisionHeadline } from "@/lib/data/headline";
import { derivationSeed, toPhysicsInput } from "@/lib/feed/physics-input";
import { eventKinds } from "@/lib/events/kinds";
import { onCandidateIngested } from "@/lib/notify/hooks";
import { joinCandidate } from "./join-trigger";
import { settleCandidate } from "@/lib/triggers/settle";
import type { FeedCandidate } from "@/lib/validations/feed";
import { appendEvent } from "@/lib/data/events";
import {
  insertCandidateStatement,
  insertCreatedEventStatement,
  insertDerivedStatement,
  insertRevisionStatement,
  insertTriggerStatement,
  lookupStatement,
  cardData,
  type NewCandidateRow,
} from "@/lib/data/ingest-sql";
import { getSetting } from "@/lib/data/settings";
import { listUnfinishedTasks } from "@/lib/data/tasks";
import { findCoincidentCandidateId, readCandidateRow, readTrigger, updateTriggerRevision } from "@/lib/data/triggers";
import { cancelTasks } from "./cancel-tasks";

/**
 * created: a new candidate; joined: a new trigger of an existing candidate (coincident in time); revised: a new
 * current revision of a trigger; stale: kept in history only; duplicate: seen before.
 */
export type IngestOutcome = "created" | "joined" | "revised" | "stale" | "duplicate";

export interface IngestResult {
  status: 200 | 201;
  outcome: IngestOutcome;
  /** the candidate's id: the same for every trigger of one signal */
  id: string;
  triggerId: string;
  /** whether this trigger is now the candidate's preferred one */
  preferred: boolean;
  revision: number;
  /** the derived quantities as stored: JSON text, so the route answers without serialising them again */
  derivedJson: string;
}

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
  const [settings, grouping] = await Promise.all([getSetting("physics"), getSetting("grouping")]);
  derivationsRunning += 1;
  let derived: DerivedForFeed;
  try {
    derived = await derivePool().run(toPhysicsInput(payload, receivedAt), settings, derivationSeed(payload));
  } finally {
    derivationsRunning -= 1;
  }
  for (let attempt = 1; ; attempt++) {
    try {
      return await writeInGroup({
        payload,
        payloadJson: options.payloadJson,
        derived,
        receivedAt,
        coincidenceWindowMs: grouping.coincidenceWindowMs,
      });
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
  coincidenceWindowMs: number;
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
  // Inside the write transaction nobody else can write, so these reads decide for good.
  const found = (await tx.sql.execute(lookupStatement(pending.payload))).rows[0];
  if (found) {
    const stored = storedAnswerFrom(found, pending.payload);
    if (stored) return stored;
    return writeRevision(tx, String(found.trigger_id), pending);
  }
  const eventTimeMs = Date.parse(pending.payload.eventTime);
  const joinId = await findCoincidentCandidateId(tx.sql, eventTimeMs, pending.coincidenceWindowMs);
  if (joinId) return joinCandidate(tx, rowFor(pending, joinId), pending.derived.json);
  return createCandidate(tx, pending);
}

/** The stored rows' fields for this post, for a trigger of a candidate (new or, with its id, already known). */
function rowFor(pending: PendingRevision, candidateId: string = randomUUID(), triggerId: string = randomUUID()): NewCandidateRow {
  return {
    candidateId,
    triggerId,
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
    triggerId: String(row.trigger_id),
    preferred: row.preferred_trigger_id === row.trigger_id,
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
 * A revision of a trigger already stored: a new current revision of that trigger, or (lower than its current one)
 * history only. The revision and its derived quantities are stored with the same statements as a new candidate's.
 */
async function writeRevision(tx: GroupWrite, triggerId: string, pending: PendingRevision): Promise<IngestResult> {
  const { payload, receivedAt: at } = pending;
  const trigger = await readTrigger(tx.orm, triggerId);
  if (!trigger) throw new Error("the trigger disappeared inside the write transaction");
  const { headline } = pending.derived;
  const outcome: IngestOutcome = payload.revision > trigger.currentRevision ? "revised" : "stale";
  const row = rowFor(pending, trigger.candidateId, trigger.id);
  await tx.sql.execute(insertRevisionStatement(row));
  await tx.sql.execute(insertDerivedStatement(row));
  let preferred = false;
  if (outcome === "revised") preferred = await reviseTrigger(tx.orm, trigger, payload, headline, at);
  else {
    const candidate = await readCandidateRow(tx.orm, trigger.candidateId);
    preferred = candidate?.preferredTriggerId === trigger.id;
    await appendEvent(tx.orm, {
      at,
      kind: eventKinds.candidateRevisionStale,
      candidateId: trigger.candidateId,
      data: { revision: payload.revision, current: trigger.currentRevision, stage: payload.stage, triggerId: trigger.id, source: trigger.source },
    });
  }
  return { status: 201, outcome, id: trigger.candidateId, triggerId: trigger.id, preferred, revision: payload.revision, derivedJson: pending.derived.json };
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
  await tx.sql.execute(insertTriggerStatement(row));
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
      chirpMassDetectorFrame: derived.headline.chirpMassDetectorFrame,
      distanceMpc: payload.distanceMpc ?? null,
      // a first post has no sky map yet
      area90Deg2: null,
    },
  });
  if (payload.stage === "withdrawn") await withdrawCandidate(tx.orm, row.candidateId, payload.revision, receivedAt);
  await tx.sql.execute(insertRevisionStatement(row));
  await tx.sql.execute(insertDerivedStatement(row));
  return {
    status: 201,
    outcome: "created",
    id: row.candidateId,
    triggerId: row.triggerId,
    preferred: true,
    revision: payload.revision,
    derivedJson: derived.json,
  };
}

function headlineOfTrigger(row: Trigger): RevisionHeadline {
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

/**
 * A new current revision of one trigger: the trigger's numbers, then the candidate settled again from all its
 * triggers (the preferred one may change). The candidate is withdrawn only when its last live trigger is; a later
 * revision that is not a withdrawal reinstates the trigger, and with it the candidate. Answers whether this trigger
 * is now the preferred one.
 */
async function reviseTrigger(tx: Tx, trigger: Trigger, payload: FeedCandidate, headline: DerivedHeadline, at: Date): Promise<boolean> {
  const withdrawn = payload.stage === "withdrawn";
  const next = revisionHeadline(payload, headline);
  await updateTriggerRevision(
    tx,
    trigger.id,
    { ...next, currentRevision: payload.revision, eventTime: new Date(payload.eventTime) },
    withdrawn ? (trigger.withdrawnAt ?? at) : null,
    at,
  );
  const settled = await settleCandidate(tx, trigger.candidateId, at, "revision");
  const changes = diffHeadlines(headlineOfTrigger(trigger), next);
  const event = await appendEvent(tx, {
    at,
    kind: eventKinds.candidateRevised,
    candidateId: trigger.candidateId,
    data: {
      ...cardData(payload, headline),
      previousRevision: trigger.currentRevision,
      changes,
      triggerId: trigger.id,
      preferred: settled.preferred.id === trigger.id,
    },
  });
  // The preferred trigger is withdrawn only when every trigger is (lib/triggers/preferred.ts): paging stops then.
  await onCandidateIngested(tx, {
    candidateId: trigger.candidateId,
    eventId: event.id,
    revision: payload.revision,
    stage: settled.preferred.stage,
    falseAlarmRatePerYear: settled.preferred.falseAlarmRatePerYear,
    isNewCandidate: false,
    receivedAt: at,
  });
  if (settled.becameWithdrawn) await withdrawCandidate(tx, trigger.candidateId, payload.revision, at);
  return settled.preferred.id === trigger.id;
}

/** Withdraws the candidate: its event, then its unfinished follow-up tasks cancelled through cancelTasks. */
async function withdrawCandidate(tx: Tx, candidateId: string, revision: number, at: Date): Promise<void> {
  const tasks = await listUnfinishedTasks(tx, candidateId);
  const withdrawnEvent = await appendEvent(tx, {
    at,
    kind: eventKinds.candidateWithdrawn,
    candidateId,
    toState: "withdrawn",
    data: { revision, cancelledTaskIds: tasks.map((task) => task.id) },
  });
  await cancelTasks(tx, { candidateId, tasks, reason: withdrawalReason, actorId: null, at, causeEventId: withdrawnEvent.id });
}
