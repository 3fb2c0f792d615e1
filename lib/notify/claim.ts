import { getDb } from "@/db";
import type { Notification } from "@/db/schema";
import { appendEvent } from "@/lib/data/events";
import { finishLeasedRow, leaseDueNotifications, type LeasedRowUpdate } from "@/lib/data/outbox";
import { eventKinds } from "@/lib/events/kinds";
import { escalateEarly } from "./escalate-early";
import type { NotificationPayload } from "./outbox";

/** How long a worker holds a page: longer than a send may take (the worker cuts a send off before it ends). */
export const PAGE_LEASE_MS = 20_000;

/**
 * Leases up to `limit` due rows to `workerId` until now + leaseMs (pages: pageLeaseMs), counting the attempt; two
 * workers never lease the same row. A crashed worker's lease expires and the row becomes claimable again:
 * delivery is at least once.
 */
export async function claimDueNotifications(
  workerId: string,
  now: Date,
  leaseMs: number,
  limit: number,
  // A page's lease is short, so a crashed worker's pages are sent again within seconds, not a minute.
  pageLeaseMs = Math.min(leaseMs, PAGE_LEASE_MS),
): Promise<Notification[]> {
  return leaseDueNotifications(workerId, now, leaseMs, pageLeaseMs, limit);
}

export type Outcome =
  | { status: "sent"; payload?: NotificationPayload }
  | { status: "skipped"; reason: string; payload?: NotificationPayload }
  | { status: "retry"; error: string; nextAttemptAt: Date; payload?: NotificationPayload; escalateNow?: boolean }
  | { status: "failed"; error: string; payload?: NotificationPayload };

/** Records what happened to a leased row; false when the lease was lost meanwhile (another worker owns it). */
export async function recordOutcome(row: Notification, workerId: string, outcome: Outcome, now: Date): Promise<boolean> {
  const db = await getDb();
  const payload = outcome.payload ? { payload: outcome.payload } : {};
  if (outcome.status === "failed") {
    return db.transaction(async (tx) => {
      if (!(await finishLeasedRow(tx, row.id, workerId, { ...payload, status: "failed", lastError: outcome.error.slice(0, 1000) }))) return false;
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
  const set: LeasedRowUpdate =
    outcome.status === "sent"
      ? { ...payload, status: "sent", sentAt: now, lastError: null }
      : outcome.status === "skipped"
        ? { ...payload, status: "skipped", lastError: outcome.reason.slice(0, 1000) }
        : { ...payload, status: "pending", nextAttemptAt: outcome.nextAttemptAt, lastError: outcome.error.slice(0, 1000) };
  if (outcome.status === "retry" && outcome.escalateNow && row.candidateId) {
    const candidateId = row.candidateId;
    return db.transaction(async (tx) => {
      if (!(await finishLeasedRow(tx, row.id, workerId, set))) return false;
      await escalateEarly(tx, candidateId, now, { notificationId: row.id, channel: row.channel, userId: row.userId, attempts: row.attempts, error: outcome.error.slice(0, 200) });
      return true;
    });
  }
  return finishLeasedRow(db, row.id, workerId, set);
}
