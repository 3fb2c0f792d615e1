import { and, desc, eq, inArray, isNull, sql } from "drizzle-orm";
import type { Tx } from "@/db";
import { candidateRevisions, candidates, notificationPreferences, siteObservers, skymaps, users, type Candidate, type PagingPreferences } from "@/db/schema";

/* The people paging reaches and what it reads about them: active users, coordinators, time zones, site observers. */

export interface Recipient {
  id: string;
  name: string;
  timeZone: string;
}

const recipientColumns = { id: users.id, name: users.name, timeZone: users.timeZone };

/** The active users among `ids` (missing ids are skipped). */
export async function activeUsersByIds(tx: Tx, ids: Array<string | null | undefined>): Promise<Recipient[]> {
  const wanted = ids.filter((id): id is string => typeof id === "string");
  if (wanted.length === 0) return [];
  return tx.select(recipientColumns).from(users).where(and(inArray(users.id, wanted), isNull(users.disabledAt)));
}

export async function activeCoordinators(tx: Tx): Promise<Recipient[]> {
  return tx.select(recipientColumns).from(users).where(and(eq(users.role, "coordinator"), isNull(users.disabledAt)));
}

/** A person's time zone, or null for an unknown id. */
export async function userTimeZone(tx: Tx, userId: string): Promise<string | null> {
  const [row] = await tx.select({ timeZone: users.timeZone }).from(users).where(eq(users.id, userId)).limit(1);
  return row?.timeZone ?? null;
}

/** A candidate's row, as the page texts read it. */
export async function readCandidateRow(tx: Tx, candidateId: string): Promise<Candidate | null> {
  const [row] = await tx.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  return row ?? null;
}

/** What a page says beyond the candidate row: the reported distance of its preferred trigger's current revision and
 * the 90 % area of its newest sky map (each null when absent, as at first look before a map). */
export async function readPageExtras(tx: Tx, candidate: Pick<Candidate, "id" | "preferredTriggerId" | "currentRevision">): Promise<{ distanceMpc: { mean: number; sd: number } | null; area90Deg2: number | null }> {
  const [revision] = candidate.preferredTriggerId
    ? await tx
        .select({ distance: sql<string | null>`json_extract(${candidateRevisions.payload}, '$.distanceMpc')` })
        .from(candidateRevisions)
        .where(and(eq(candidateRevisions.triggerId, candidate.preferredTriggerId), eq(candidateRevisions.revision, candidate.currentRevision)))
        .limit(1)
    : [];
  const [map] = await tx.select({ area90Deg2: skymaps.area90Deg2 }).from(skymaps).where(eq(skymaps.candidateId, candidate.id)).orderBy(desc(skymaps.createdAt)).limit(1);
  let distanceMpc: { mean: number; sd: number } | null = null;
  try {
    const parsed = revision?.distance ? (JSON.parse(revision.distance) as { mean?: unknown; sd?: unknown }) : null;
    if (parsed && typeof parsed.mean === "number" && typeof parsed.sd === "number") distanceMpc = { mean: parsed.mean, sd: parsed.sd };
  } catch {
    distanceMpc = null;
  }
  return { distanceMpc, area90Deg2: map?.area90Deg2 ?? null };
}

/** Every saved preferences row (few: one per person who saved). */
export async function listSavedPreferences(tx: Tx): Promise<Array<{ userId: string; preferences: PagingPreferences }>> {
  return tx.select({ userId: notificationPreferences.userId, preferences: notificationPreferences.preferences }).from(notificationPreferences);
}

/** (site, person) for the active observers of the given sites. */
export async function activeObserversOf(tx: Tx, siteIds: string[]): Promise<Array<{ siteId: string; userId: string }>> {
  if (siteIds.length === 0) return [];
  return tx
    .select({ siteId: siteObservers.siteId, userId: siteObservers.userId })
    .from(siteObservers)
    .innerJoin(users, eq(users.id, siteObservers.userId))
    .where(and(inArray(siteObservers.siteId, siteIds), isNull(users.disabledAt)));
}

/** Every active observer: who hears about a task that any site may take. */
export async function activeObservers(tx: Tx): Promise<string[]> {
  const rows = await tx.select({ id: users.id }).from(users).where(and(eq(users.role, "observer"), isNull(users.disabledAt)));
  return rows.map((r) => r.id);
}

/** A person's saved paging preferences, or null when they never saved any. */
export async function readSavedPreferences(q: Tx, userId: string): Promise<PagingPreferences | null> {
  const [row] = await q.select().from(notificationPreferences).where(eq(notificationPreferences.userId, userId)).limit(1);
  return row?.preferences ?? null;
}

/** Saved preferences of several people; people who never saved are absent. */
export async function readSavedPreferencesMany(q: Tx, userIds: string[]): Promise<Map<string, PagingPreferences>> {
  if (userIds.length === 0) return new Map();
  const rows = await q.select().from(notificationPreferences).where(inArray(notificationPreferences.userId, userIds));
  return new Map(rows.map((row) => [row.userId, row.preferences]));
}

export async function writePreferences(q: Tx, userId: string, preferences: PagingPreferences, now: Date): Promise<void> {
  await q
    .insert(notificationPreferences)
    .values({ userId, preferences, updatedAt: now })
    .onConflictDoUpdate({ target: notificationPreferences.userId, set: { preferences, updatedAt: now } });
}

/** The sites a person observes at. */
export async function observedSiteIds(q: Tx, userId: string): Promise<string[]> {
  const rows = await q.select({ siteId: siteObservers.siteId }).from(siteObservers).where(eq(siteObservers.userId, userId));
  return rows.map((r) => r.siteId);
}

/** A user's whole row (delivery reads the address, time zone and whether they are still active). */
export async function readUserRow(q: Tx, userId: string): Promise<typeof users.$inferSelect | null> {
  const [row] = await q.select().from(users).where(eq(users.id, userId)).limit(1);
  return row ?? null;
}

/** A candidate's triage state, or null for an unknown id. */
export async function candidateTriageState(q: Tx, candidateId: string): Promise<string | null> {
  const [row] = await q.select({ state: candidates.triageState }).from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  return row?.state ?? null;
}

/** A candidate's row with the name of whoever acknowledged it. */
export async function candidateWithAcknowledger(q: Tx, candidateId: string): Promise<{ candidate: Candidate; ackName: string | null } | null> {
  const [row] = await q
    .select({ candidate: candidates, ackName: users.name })
    .from(candidates)
    .leftJoin(users, eq(users.id, candidates.acknowledgedById))
    .where(eq(candidates.id, candidateId))
    .limit(1);
  return row ?? null;
}
