/**
 * Storage of triggers: one pipeline's report of a signal, (source, externalId) with its revisions. Every query on
 * the triggers table lives here; the choice of the preferred trigger is pure (lib/triggers/preferred.ts) and the
 * use cases that combine them are in lib/triggers/.
 */
import type { Transaction } from "@libsql/client";
import { and, asc, between, desc, eq, isNull, ne, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { candidateRevisions, candidates, events, triggers, type Candidate, type Trigger } from "@/db/schema";
import type { Tx } from "@/db";

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

/** A new candidate for one trigger (a split), its headline that trigger's; triage starts over. */
export async function insertCandidateForTrigger(tx: Tx, t: Trigger, at: Date): Promise<string> {
  const [row] = await tx
    .insert(candidates)
    .values({
      preferredTriggerId: t.id,
      source: t.source,
      externalId: t.externalId,
      currentRevision: t.currentRevision,
      stage: t.stage,
      triageState: "new",
      eventTime: t.eventTime,
      receivedAt: t.receivedAt,
      updatedAt: at,
      withdrawnAt: t.withdrawnAt,
      networkSnr: t.networkSnr,
      falseAlarmRatePerYear: t.falseAlarmRatePerYear,
      detectors: t.detectors,
      chirpMassDetectorFrame: t.chirpMassDetectorFrame,
      dominantClass: t.dominantClass,
    })
    .returning({ id: candidates.id });
  if (!row) throw new Error("candidate insert returned nothing");
  return row.id;
}

/**
 * The merge that brought `triggerId` into `candidateId`, if the candidate it came from is still merged into this
 * one: that candidate's id and every trigger the merge moved. Read from the merge events (the log is the record).
 */
export async function findMergeOrigin(tx: Tx, candidateId: string, triggerId: string): Promise<{ fromCandidateId: string; triggerIds: string[] } | null> {
  const merges = await tx
    .select({ data: events.data })
    .from(events)
    .where(and(eq(events.candidateId, candidateId), eq(events.kind, "candidate.merged")))
    .orderBy(desc(events.id));
  for (const { data } of merges) {
    const ids = Array.isArray(data?.triggerIds) ? data.triggerIds.map(String) : [];
    const from = typeof data?.fromCandidateId === "string" ? data.fromCandidateId : null;
    if (!from || from === candidateId || data?.intoCandidateId !== candidateId || !ids.includes(triggerId)) continue;
    const source = await readCandidateRow(tx, from);
    return source?.mergedIntoId === candidateId ? { fromCandidateId: from, triggerIds: ids } : null;
  }
  return null;
}

export interface NearbyCandidate {
  id: string;
  externalId: string;
  source: string;
  eventTime: Date;
  triggerCount: number;
}

/** Live, unmerged candidates with event times within ± spanMs of this one's: what a coordinator might merge. */
export async function listNearbyCandidates(candidateId: string, eventTime: Date, spanMs: number): Promise<NearbyCandidate[]> {
  const db = await getDb();
  return db
    .select({
      id: candidates.id,
      externalId: candidates.externalId,
      source: candidates.source,
      eventTime: candidates.eventTime,
      triggerCount: candidates.triggerCount,
    })
    .from(candidates)
    .where(
      and(
        ne(candidates.id, candidateId),
        isNull(candidates.mergedIntoId),
        between(candidates.eventTime, new Date(eventTime.getTime() - spanMs), new Date(eventTime.getTime() + spanMs)),
      ),
    )
    .orderBy(asc(candidates.eventTime))
    .limit(20);
}
