import { and, desc, eq, gte, inArray, isNull, lt, ne, or, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { notifications, users, type Channel, type NotificationStatus } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";

export interface Delivery {
  channel: Channel;
  status: NotificationStatus;
  attempts: number;
  lastError: string | null;
  sentAt: string | null;
}

export interface MyNotification {
  id: string;
  kind: string;
  title: string;
  body: string;
  url: string | null;
  candidateId: string | null;
  createdAt: string;
  readAt: string | null;
  /** what became of the push and e-mail copies of the same message */
  deliveries: Delivery[];
}

/** The person's in-app notifications, newest first, each with the fate of its push and e-mail copies. */
export async function listMyNotifications(
  userId: string,
  options: { limit: number; before?: number; unreadOnly?: boolean },
): Promise<MyNotification[]> {
  const db = await getDb();
  const rows = await db
    .select()
    .from(notifications)
    .where(
      and(
        eq(notifications.userId, userId),
        eq(notifications.channel, "in-app"),
        options.before ? lt(notifications.createdAt, new Date(options.before)) : undefined,
        options.unreadOnly ? isNull(notifications.readAt) : undefined,
      ),
    )
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(options.limit);
  const eventIds = [...new Set(rows.flatMap((r) => (r.eventId === null ? [] : [r.eventId])))];
  const copies =
    eventIds.length === 0
      ? []
      : await db
          .select()
          .from(notifications)
          .where(and(eq(notifications.userId, userId), inArray(notifications.eventId, eventIds), ne(notifications.channel, "in-app")));
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    title: r.title,
    body: r.body,
    url: r.url,
    candidateId: r.candidateId,
    createdAt: r.createdAt.toISOString(),
    readAt: r.readAt?.toISOString() ?? null,
    deliveries: copies
      .filter((c) => c.eventId === r.eventId)
      .map((c) => ({ channel: c.channel, status: c.status, attempts: c.attempts, lastError: c.lastError, sentAt: c.sentAt?.toISOString() ?? null })),
  }));
}

export async function countUnread(userId: string): Promise<number> {
  const db = await getDb();
  const [row] = await db
    .select({ n: sql<number>`count(*)` })
    .from(notifications)
    .where(and(eq(notifications.userId, userId), eq(notifications.channel, "in-app"), isNull(notifications.readAt)));
  return Number(row?.n ?? 0);
}

/** Marks the person's own notifications read (all copies of each message); others' ids are ignored. */
export async function markRead(userId: string, target: { ids: string[] } | { all: true }, now = new Date()): Promise<number> {
  const db = await getDb();
  const mine = and(eq(notifications.userId, userId), isNull(notifications.readAt));
  if ("all" in target) {
    await db.update(notifications).set({ readAt: now }).where(mine);
  } else {
    const picked = await db.select({ eventId: notifications.eventId }).from(notifications).where(and(mine, inArray(notifications.id, target.ids)));
    const eventIds = picked.flatMap((p) => (p.eventId === null ? [] : [p.eventId]));
    await db.update(notifications).set({ readAt: now }).where(and(mine, inArray(notifications.id, target.ids)));
    if (eventIds.length > 0) await db.update(notifications).set({ readAt: now }).where(and(mine, inArray(notifications.eventId, eventIds)));
  }
  return countUnread(userId);
}

export interface FailedNotification {
  id: string;
  channel: Channel;
  kind: string;
  title: string;
  candidateId: string | null;
  recipient: { id: string; name: string; email: string } | null;
  attempts: number;
  lastError: string | null;
  createdAt: string;
  /** a page for an unanswered candidate that keeps failing but is still being retried */
  stillRetrying: boolean;
}

/**
 * Messages the worker gave up on, and pages still retrying after repeated failures, newest first (coordinators
 * see these, so nothing fails silently).
 */
export async function listFailedNotifications(limit = 100, failingAttempts = 3): Promise<FailedNotification[]> {
  const db = await getDb();
  const rows = await db
    .select({ n: notifications, u: { id: users.id, name: users.name, email: users.email } })
    .from(notifications)
    .leftJoin(users, eq(users.id, notifications.userId))
    .where(
      or(
        eq(notifications.status, "failed"),
        and(inArray(notifications.status, ["pending", "sending"]), inArray(notifications.kind, ["page", "escalation"]), gte(notifications.attempts, failingAttempts)),
      ),
    )
    .orderBy(desc(notifications.createdAt))
    .limit(limit);
  return rows.map(({ n, u }) => ({
    id: n.id,
    channel: n.channel,
    kind: n.kind,
    title: n.title,
    candidateId: n.candidateId,
    recipient: u?.id ? u : null,
    attempts: n.attempts,
    lastError: n.lastError,
    createdAt: n.createdAt.toISOString(),
    stillRetrying: n.status !== "failed",
  }));
}

/** Puts a failed message back in the outbox with a fresh attempt budget. */
export async function retryFailedNotification(_actor: SessionUser, id: string, now = new Date()): Promise<void> {
  const db = await getDb();
  const done = await db
      .update(notifications)
      .set({ status: "pending", attempts: 0, nextAttemptAt: now, lockedBy: null, lockedUntil: null })
      .where(and(eq(notifications.id, id), eq(notifications.status, "failed")))
      .returning({ id: notifications.id });
  if (done.length === 0) throw new ApiError(404, "no failed notification with that id");
}
