import { and, asc, eq, inArray, isNull, lt, lte, or, sql } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { ackTokens, notifications, type NewNotification, type Notification } from "@/db/schema";

/*
 * The outbox's rows: pages, notices and their one-click acknowledge tokens. What goes in them and when is
 * lib/notify's business; this module only reads and writes them.
 */

/**
 * Stores acknowledge tokens first (the rows link to them), then the rows; a repeat of a dedupe key is ignored.
 * Returns how many rows were new.
 */
export async function insertNotifications(tx: Tx, rows: NewNotification[], tokenRows: Array<typeof ackTokens.$inferInsert>): Promise<number> {
  if (rows.length === 0) return 0;
  // One statement for every recipient's tokens, before the rows that link to them.
  if (tokenRows.length > 0) await tx.insert(ackTokens).values(tokenRows);
  const inserted = await tx.insert(notifications).values(rows).onConflictDoNothing({ target: notifications.dedupeKey }).returning({ id: notifications.id });
  return inserted.length;
}

/** Cancels a candidate's pages not yet handed to a channel; rows a worker holds ("sending") are left to finish. */
export async function cancelPendingPages(tx: Tx, candidateId: string, reason: string, now: Date): Promise<number> {
  const dropped = await tx
    .update(notifications)
    .set({ status: "cancelled", lastError: reason, lockedBy: null, lockedUntil: null, nextAttemptAt: now })
    .where(and(eq(notifications.candidateId, candidateId), eq(notifications.status, "pending"), inArray(notifications.kind, ["page", "escalation"])))
    .returning({ id: notifications.id });
  return dropped.length;
}

/** Rows a worker may take: waiting or abandoned by a worker whose lease ran out, due now, on an outside channel. */
const claimable = (now: Date) =>
  and(
    inArray(notifications.status, ["pending", "sending"]),
    inArray(notifications.channel, ["push", "email"]),
    lte(notifications.nextAttemptAt, now),
    or(isNull(notifications.lockedUntil), lt(notifications.lockedUntil, now)),
  );

/**
 * Leases up to `limit` due rows to `workerId`, counting the attempt: pages until now + pageLeaseMs, other rows until
 * now + leaseMs. One UPDATE … WHERE id IN (SELECT … LIMIT n) … RETURNING inside BEGIN IMMEDIATE: the write lock is
 * taken before the rows are chosen, so two workers (threads or processes on one file) never lease the same row.
 */
export async function leaseDueNotifications(workerId: string, now: Date, leaseMs: number, pageLeaseMs: number, limit: number): Promise<Notification[]> {
  const db = await getDb();
  // A plain read first, so an idle worker never takes the write lock.
  const [any] = await db.select({ id: notifications.id }).from(notifications).where(claimable(now)).limit(1);
  if (!any) return [];
  return db.transaction(async (tx) => {
    const due = tx.select({ id: notifications.id }).from(notifications).where(claimable(now)).orderBy(asc(notifications.nextAttemptAt)).limit(limit);
    return tx
      .update(notifications)
      .set({
        status: "sending",
        lockedBy: workerId,
        lockedUntil: sql`case when ${notifications.kind} in ('page', 'escalation') then ${now.getTime() + pageLeaseMs} else ${now.getTime() + leaseMs} end`,
        attempts: sql`${notifications.attempts} + 1`,
      })
      .where(and(inArray(notifications.id, due), claimable(now)))
      .returning();
  });
}

/** What a finished attempt writes on its row (status, error, the payload's delivery notes). */
export type LeasedRowUpdate = Partial<Pick<Notification, "status" | "sentAt" | "lastError" | "nextAttemptAt" | "payload">>;

/** Writes an attempt's result and releases the lease; false when the lease was lost meanwhile (another worker owns it). */
export async function finishLeasedRow(q: Tx, rowId: string, workerId: string, set: LeasedRowUpdate): Promise<boolean> {
  const [done] = await q
    .update(notifications)
    .set({ ...set, lockedBy: null, lockedUntil: null })
    .where(and(eq(notifications.id, rowId), eq(notifications.lockedBy, workerId), eq(notifications.status, "sending")))
    .returning({ id: notifications.id });
  return Boolean(done);
}

export type AckTokenRow = typeof ackTokens.$inferSelect;

export async function readAckToken(q: Tx, id: string): Promise<AckTokenRow | null> {
  const [row] = await q.select().from(ackTokens).where(eq(ackTokens.id, id)).limit(1);
  return row ?? null;
}

/** Marks a single-use token used; false when it was used already (another click won). */
export async function spendAckToken(q: Tx, id: string, now: Date): Promise<boolean> {
  const spent = await q.update(ackTokens).set({ usedAt: now }).where(and(eq(ackTokens.id, id), isNull(ackTokens.usedAt))).returning({ id: ackTokens.id });
  return spent.length > 0;
}

/** Makes a spent token usable again (the acknowledgement it was spent on did not happen). */
export async function unspendAckToken(q: Tx, id: string): Promise<void> {
  await q.update(ackTokens).set({ usedAt: null }).where(eq(ackTokens.id, id));
}
