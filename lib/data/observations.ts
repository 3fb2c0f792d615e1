import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { candidates, followUpTasks, instruments, observations, siteObservers, skymaps, uploads, type Instrument, type NewObservation, type Observation } from "@/db/schema";

/** Storage of the observation log: queries only; the service decides who may write and what a row means. */

export interface TaskForRecording {
  id: string;
  candidateId: string;
  siteId: string | null;
  claimedById: string | null;
}

export async function readTaskForRecording(tx: Tx, taskId: string): Promise<TaskForRecording | null> {
  const [row] = await tx
    .select({ id: followUpTasks.id, candidateId: followUpTasks.candidateId, siteId: followUpTasks.siteId, claimedById: followUpTasks.claimedById })
    .from(followUpTasks)
    .where(eq(followUpTasks.id, taskId))
    .limit(1);
  return row ?? null;
}

export async function findInstrumentsByIds(tx: Tx, ids: readonly string[]): Promise<Instrument[]> {
  if (ids.length === 0) return [];
  return tx.select().from(instruments).where(inArray(instruments.id, [...ids]));
}

export async function instrumentsAtSite(tx: Tx, siteId: string): Promise<Instrument[]> {
  return tx.select().from(instruments).where(eq(instruments.siteId, siteId)).orderBy(asc(instruments.name), asc(instruments.id));
}

/** The sites a person observes at. */
export async function sitesObservedBy(tx: Tx, userId: string): Promise<string[]> {
  const rows = await tx.select({ siteId: siteObservers.siteId }).from(siteObservers).where(eq(siteObservers.userId, userId));
  return rows.map((r) => r.siteId);
}

/** Inserts the rows in one statement per 200 (SQLite's bound-parameter limit), answering the ids in row order. */
export async function insertObservations(tx: Tx, rows: NewObservation[]): Promise<string[]> {
  const ids: string[] = [];
  for (let i = 0; i < rows.length; i += 200) {
    const batch = rows.slice(i, i + 200).map((row) => ({ ...row, id: row.id ?? crypto.randomUUID() }));
    await tx.insert(observations).values(batch);
    ids.push(...batch.map((row) => row.id));
  }
  return ids;
}

/** A candidate's whole log, oldest start first (the coverage service orders by end time itself). */
export async function listCandidateObservations(candidateId: string, tx?: Tx): Promise<Observation[]> {
  const q = tx ?? (await getDb());
  return q.select().from(observations).where(eq(observations.candidateId, candidateId)).orderBy(asc(observations.startTime), asc(observations.createdAt));
}

/** A task's own observations, oldest start first (the task view); null when there is no such task. */
export async function listTaskObservations(taskId: string): Promise<Observation[] | null> {
  const db = await getDb();
  if (!(await readTaskForRecording(db, taskId))) return null;
  return db.select().from(observations).where(eq(observations.taskId, taskId)).orderBy(asc(observations.startTime));
}

/** A candidate's log for drawing and lists; null when there is no such candidate. */
export async function listCandidateLog(candidateId: string): Promise<Observation[] | null> {
  const db = await getDb();
  const [candidate] = await db.select({ id: candidates.id }).from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!candidate) return null;
  return listCandidateObservations(candidateId, db);
}

const ID_CHUNK = 500;

async function inChunks<T>(ids: readonly string[], read: (chunk: string[]) => Promise<T[]>): Promise<T[]> {
  const out: T[] = [];
  for (let i = 0; i < ids.length; i += ID_CHUNK) out.push(...(await read(ids.slice(i, i + ID_CHUNK))));
  return out;
}

/** The logs of many candidates at once (the review), oldest start first. */
export async function listObservationsOf(candidateIds: readonly string[], tx?: Tx): Promise<Observation[]> {
  const q = tx ?? (await getDb());
  return inChunks(candidateIds, (chunk) =>
    q.select().from(observations).where(inArray(observations.candidateId, chunk)).orderBy(asc(observations.startTime), asc(observations.id)),
  );
}

/** Each candidate's newest sky map file (the one coverage is measured on), for the candidates that have one. */
export async function newestSkymapFilesOf(candidateIds: readonly string[], tx?: Tx): Promise<Map<string, { skymapId: string; sha256: string }>> {
  const q = tx ?? (await getDb());
  const rows = await inChunks(candidateIds, (chunk) =>
    q
      .select({ candidateId: skymaps.candidateId, skymapId: skymaps.id, sha256: uploads.sha256 })
      .from(skymaps)
      .innerJoin(uploads, eq(uploads.id, skymaps.uploadId))
      .where(inArray(skymaps.candidateId, chunk))
      .orderBy(desc(skymaps.createdAt)),
  );
  const newest = new Map<string, { skymapId: string; sha256: string }>();
  for (const r of rows) if (!newest.has(r.candidateId)) newest.set(r.candidateId, { skymapId: r.skymapId, sha256: r.sha256 });
  return newest;
}

/** Removes the exposures a tick recorded for one planned tile of a candidate; answers how many. */
export async function deleteTickObservations(tx: Tx, tile: { candidateId: string; pointingIndex: number; raDeg: number; decDeg: number }): Promise<number> {
  const gone = await tx
    .delete(observations)
    .where(
      and(
        eq(observations.candidateId, tile.candidateId),
        eq(observations.source, "tick"),
        eq(observations.pointingIndex, tile.pointingIndex),
        eq(observations.raDeg, tile.raDeg),
        eq(observations.decDeg, tile.decDeg),
      ),
    )
    .returning({ id: observations.id });
  return gone.length;
}
