/**
 * Storage of triggers: one pipeline's report of a signal, (source, externalId) with its revisions. Every query on
 * the triggers table lives here; the choice of the preferred trigger is pure (lib/triggers/preferred.ts) and the
 * use cases that combine them are in lib/triggers/.
 */
import type { Transaction } from "@libsql/client";
import { and, asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { candidateRevisions, candidates, triggers, type Candidate, type Trigger } from "@/db/schema";
import type { Tx } from "./events";

/**
 * The live candidate with a live trigger nearest in event time to `eventTimeMs`, within ± windowMs (edge
 * included), or null. Run inside the write transaction, where no other writer (process) can add a trigger
 * between this read and the insert that follows it: that is what makes grouping race-free.
 */
export async function findCoincidentCandidateId(
  client: Pick<Transaction, "execute">,
  eventTimeMs: number,
  windowMs: number,
): Promise<string | null> {
  const row = (
    await client.execute({
      sql:
        "select t.candidate_id as id, min(abs(t.event_time - ?)) as gap from triggers t " +
        "join candidates c on c.id = t.candidate_id " +
        "where t.event_time between ? and ? and t.withdrawn_at is null and c.withdrawn_at is null and c.merged_into_id is null " +
        "group by t.candidate_id order by gap, t.candidate_id limit 1",
      args: [eventTimeMs, eventTimeMs - windowMs, eventTimeMs + windowMs],
    })
  ).rows[0];
  return row ? String(row.id) : null;
}

export async function readTrigger(tx: Tx, triggerId: string): Promise<Trigger | null> {
  const [row] = await tx.select().from(triggers).where(eq(triggers.id, triggerId)).limit(1);
  return row ?? null;
}

export async function readCandidateRow(tx: Tx, candidateId: string): Promise<Candidate | null> {
  const [row] = await tx.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  return row ?? null;
}

/** A candidate's triggers, first received first. */
export async function listTriggersOf(tx: Tx, candidateId: string): Promise<Trigger[]> {
  return tx.select().from(triggers).where(eq(triggers.candidateId, candidateId)).orderBy(asc(triggers.receivedAt), sql`rowid`);
}

/** The columns of a trigger that a new current revision replaces. */
export type TriggerNumbers = Pick<
  Trigger,
  "currentRevision" | "stage" | "eventTime" | "networkSnr" | "falseAlarmRatePerYear" | "detectors" | "chirpMassDetectorFrame" | "dominantClass"
>;

export async function updateTriggerRevision(
  tx: Tx,
  triggerId: string,
  numbers: TriggerNumbers,
  withdrawnAt: Date | null,
  at: Date,
): Promise<void> {
  await tx.update(triggers).set({ ...numbers, withdrawnAt, updatedAt: at }).where(eq(triggers.id, triggerId));
}

/** The candidate's headline columns as copies of its preferred trigger, and what follows from all its triggers. */
export interface CandidateFromTriggers {
  preferred: Trigger;
  triggerCount: number;
  receivedAt: Date;
  withdrawnAt: Date | null;
}

export async function writeCandidateFromTriggers(tx: Tx, candidateId: string, c: CandidateFromTriggers, at: Date): Promise<void> {
  const p = c.preferred;
  await tx
    .update(candidates)
    .set({
      preferredTriggerId: p.id,
      source: p.source,
      externalId: p.externalId,
      currentRevision: p.currentRevision,
      stage: p.stage,
      eventTime: p.eventTime,
      networkSnr: p.networkSnr,
      falseAlarmRatePerYear: p.falseAlarmRatePerYear,
      detectors: p.detectors,
      chirpMassDetectorFrame: p.chirpMassDetectorFrame,
      dominantClass: p.dominantClass,
      triggerCount: c.triggerCount,
      receivedAt: c.receivedAt,
      withdrawnAt: c.withdrawnAt,
      updatedAt: at,
      version: sql`${candidates.version} + 1`,
    })
    .where(eq(candidates.id, candidateId));
}

/** Moves a trigger, with its revisions, to another candidate (split and merge). */
export async function moveTrigger(tx: Tx, triggerId: string, toCandidateId: string): Promise<void> {
  await tx.update(triggers).set({ candidateId: toCandidateId }).where(eq(triggers.id, triggerId));
  await tx.update(candidateRevisions).set({ candidateId: toCandidateId }).where(eq(candidateRevisions.triggerId, triggerId));
}

export async function markMerged(tx: Tx, candidateId: string, intoId: string | null, at: Date): Promise<void> {
  await tx
    .update(candidates)
    .set({ mergedIntoId: intoId, triggerCount: 0, updatedAt: at, version: sql`${candidates.version} + 1` })
    .where(eq(candidates.id, candidateId));
}

/** The triggers of a candidate for the API and the candidate page. */
export async function readTriggersForDetail(candidateId: string): Promise<Trigger[]> {
  return listTriggersOf(await getDb(), candidateId);
}

/** The revision id of a trigger's revision number, or null. */
export async function revisionIdOf(tx: Tx, triggerId: string, revision: number): Promise<string | null> {
  const [row] = await tx
    .select({ id: candidateRevisions.id })
    .from(candidateRevisions)
    .where(and(eq(candidateRevisions.triggerId, triggerId), eq(candidateRevisions.revision, revision)))
    .limit(1);
  return row?.id ?? null;
}
