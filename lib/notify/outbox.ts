import type { ackTokens, Channel, NewNotification } from "@/db/schema";
import type { Tx } from "@/db";
import { cancelPendingEscalations } from "@/lib/data/escalations";
import { cancelPendingPages, insertNotifications } from "@/lib/data/outbox";
import { ackLinkSecret, mintAckToken } from "./ack-links";
import { ackConfirmPath, ackPagePath, appBaseUrl } from "./links";

export type NotificationKind = "page" | "escalation" | "notice" | "task-created" | "task-cancelled" | "test";

/** What the worker and the UI read from `notifications.payload`. */
export interface NotificationPayload {
  tag: string;
  /** the page went to the on-call primary for their shift: quiet hours and channel switches do not apply */
  onCall?: boolean;
  /** acknowledge page (GET shows a button) and the POST target the service worker calls */
  ackPageUrl?: string;
  ackUrl?: string;
  ackExpiresAt?: string;
  /** push subscriptions this row already reached, so a retry skips them */
  deliveredTo?: string[];
  [key: string]: unknown;
}

export interface QueueSpec {
  eventId: number;
  kind: NotificationKind;
  title: string;
  body: string;
  /** path inside the app, e.g. /candidates/<id> */
  path: string;
  candidateId?: string | null;
  taskId?: string | null;
  /** outside channels to try; an in-app row is always written and is sent at once */
  channels: Array<Exclude<Channel, "in-app">>;
  onCall?: boolean;
  /** give push and e-mail a one-click acknowledge link for the candidate */
  ackable?: boolean;
  now: Date;
}

export const dedupeKey = (eventId: number, userId: string, channel: Channel) => `${eventId}:${userId}:${channel}`;

/**
 * Writes one row per (event, recipient, channel) in the caller's transaction; a repeat of the same key is
 * ignored, so replaying an event never pages twice. Returns how many rows were new.
 */
export async function queueNotifications(tx: Tx, spec: QueueSpec, userIds: readonly string[]): Promise<number> {
  const secret = spec.ackable && spec.candidateId ? ackLinkSecret() : null;
  const base = appBaseUrl();
  const tag = spec.candidateId ? `candidate-${spec.candidateId}` : `${spec.kind}-${spec.eventId}`;
  const rows: NewNotification[] = [];
  const tokenRows: Array<typeof ackTokens.$inferInsert> = [];
  for (const userId of new Set(userIds)) {
    const common = {
      eventId: spec.eventId,
      userId,
      kind: spec.kind,
      candidateId: spec.candidateId ?? null,
      taskId: spec.taskId ?? null,
      title: spec.title,
      body: spec.body,
      url: base + spec.path,
      createdAt: spec.now,
      nextAttemptAt: spec.now,
    };
    rows.push({ ...common, dedupeKey: dedupeKey(spec.eventId, userId, "in-app"), channel: "in-app", status: "sent", sentAt: spec.now, payload: { tag } });
    for (const channel of spec.channels) {
      const payload: NotificationPayload = { tag, ...(spec.onCall ? { onCall: true } : {}) };
      if (secret && spec.candidateId) {
        const { token, expiresAt, row } = mintAckToken({ candidateId: spec.candidateId, userId, now: spec.now }, secret);
        tokenRows.push(row);
        payload.ackPageUrl = base + ackPagePath(token);
        payload.ackUrl = base + ackConfirmPath(token);
        payload.ackExpiresAt = expiresAt.toISOString();
      }
      rows.push({ ...common, dedupeKey: dedupeKey(spec.eventId, userId, channel), channel, status: "pending", payload });
    }
  }
  return insertNotifications(tx, rows, tokenRows);
}

/**
 * Stops everything still waiting for a candidate: pending escalation timers, and pages not yet handed to
 * a channel. Rows a worker holds right now (status "sending") finish; the ack state stops the next step.
 */
export async function cancelCandidatePaging(tx: Tx, candidateId: string, reason: string, now: Date): Promise<{ escalations: number; notifications: number }> {
  const escalationsStopped = await cancelPendingEscalations(tx, candidateId);
  return { escalations: escalationsStopped, notifications: await cancelPendingPages(tx, candidateId, reason, now) };
}
