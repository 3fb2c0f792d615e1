import { and, asc, eq, inArray, isNull, lt, lte, or, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { notifications, type Notification } from "@/db/schema";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { escalateEarly } from "./escalate-early";
import type { NotificationPayload } from "./outbox";

/** How long a worker holds a page: longer than a send may take (the worker cuts a send off before it ends). */
export const PAGE_LEASE_MS = 20_000;

/** Rows a worker may take: waiting or abandoned by a worker whose lease ran out, due now, on an outside channel. */
const claimable = (now: Date) =>
  and(
    inArray(notifications.status, ["pending", "sending"]),
    inArray(notifications.channel, ["push", "email"]),
    lte(notifications.nextAttemptAt, now),
    or(isNull(notifications.lockedUntil), lt(notifications.lockedUntil, now)),
  );

/**
 * Leases up to `limit` due rows to `workerId` until now + leaseMs, counting the attempt. One UPDATE … WHERE id IN
 * (SELECT … LIMIT n) … RETURNING inside BEGIN IMMEDIATE: the write lock is taken before the rows are chosen, so
 * two workers (threads or processes on one file) never lease the same row. A crashed worker's lease expires and
 * the row becomes claimable again: delivery is at least once.
 */
export async function claimDueNotifications(
  workerId: string,
  now: Date,
  leaseMs: number,
  limit: number,
  pageLeaseMs = Math.min(leaseMs, PAGE_LEASE_MS),
): Promise<Notification[]> {
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
          // A page's lease is short, so a crashed worker's pages are sent again within seconds, not a minute.
          lockedUntil: sql`case when ${notifications.kind} in ('page', 'escalation') then ${now.getTime() + pageLeaseMs} else ${now.getTime() + leaseMs} end`,
          attempts: sql`${notifications.attempts} + 1`,
        })
        .where(and(inArray(notifications.id, due), claimable(now)))
        .returning();
    });
}

export type Outcome =
  | { status: "sent"; payload?: NotificationPayload }
  | { status: "skipped"; reason: string; payload?: NotificationPayload }
  | { status: "retry"; error: string; nextAttemptAt: Date; payload?: NotificationPayload; escalateNow?: boolean }
  | { status: "failed"; error: string; payload?: NotificationPayload };

/** Records what happened to a leased row; false when the lease was lost meanwhile (another worker owns it). */
export async function recordOutcome(row: Notification, workerId: string, outcome: Outcome, now: Date): Promise<boolean> {
  const db = await getDb();
  const mine = and(eq(notifications.id, row.id), eq(notifications.lockedBy, workerId), eq(notifications.status, "sending"));
  const release = { lockedBy: null, lockedUntil: null, ...(outcome.payload ? { payload: outcome.payload } : {}) };
  if (outcome.status === "failed") {
    return db.transaction(async (tx) => {
      const [done] = await tx
        .update(notifications)
        .set({ ...release, status: "failed", lastError: outcome.error.slice(0, 1000) })
        .where(mine)
        .returning({ id: notifications.id });
      if (!done) return false;
      await appendEvent(tx, {
        at: now,
        kind: eventKinds.notificationFailed,
        candidateId: row.candidateId,
        taskId: row.taskId,
        data: { notificationId: row.id, channel: row.channel, userId: row.userId, attempts: row.attempts, error: outcome.error.slice(0, 200) },
      });
      return true;
    });
  }
  const set =
    outcome.status === "sent"
      ? { ...release, status: "sent" as const, sentAt: now, lastError: null }
      : outcome.status === "skipped"
        ? { ...release, status: "skipped" as const, lastError: outcome.reason.slice(0, 1000) }
        : { ...release, status: "pending" as const, nextAttemptAt: outcome.nextAttemptAt, lastError: outcome.error.slice(0, 1000) };
  if (outcome.status === "retry" && outcome.escalateNow && row.candidateId) {
    const candidateId = row.candidateId;
    return db.transaction(async (tx) => {
      const [done] = await tx.update(notifications).set(set).where(mine).returning({ id: notifications.id });
      if (!done) return false;
      await escalateEarly(tx, candidateId, now, { notificationId: row.id, channel: row.channel, userId: row.userId, attempts: row.attempts, error: outcome.error.slice(0, 200) });
      return true;
    });
  }
  const [done] = await db.update(notifications).set(set).where(mine).returning({ id: notifications.id });
  return Boolean(done);
}
