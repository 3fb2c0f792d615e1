import { getDb, type Tx } from "@/db";
import { anyHandoffDue, listDueHandoffs, markHandoffQueued } from "@/lib/data/handoffs";
import { insertNotifications } from "@/lib/data/outbox";
import { loadHandoffRecipients } from "@/lib/data/review";
import { appBaseUrl } from "@/lib/notify/links";
import { getHandoffSummary, handoffDedupeKey, handoffPath, staleHandoffMs } from "@/lib/review/handoff";
import { handoffText } from "@/lib/review/handoff-summary";

/** Shifts handled per call, so one write transaction stays short. */
const batchSize = 20;

export interface QueuedHandoffs {
  /** shifts marked as handed off by this call */
  shiftIds: string[];
  /** outbox rows written */
  rows: number;
}

/**
 * Finds shifts that have ended (endsAt ≤ now, handoffQueuedAt null), builds each summary, writes one e-mail row per
 * recipient (outgoing and incoming shifters, coordinators) and sets handoffQueuedAt, all in one write transaction.
 * Two workers calling at once cannot both queue a shift: the transaction is BEGIN IMMEDIATE, the mark is a
 * conditional UPDATE, and the outbox's unique dedupe key (handoff:<shift>:<user>) refuses a second row anyway.
 */
export async function queueDueHandoffs(now: Date): Promise<QueuedHandoffs> {
  const db = await getDb();
  const nowMs = now.getTime();
  const base = appBaseUrl();
  // The worker calls this every loop: a plain read first, so an idle loop never takes the write lock.
  if (!(await anyHandoffDue(now))) return { shiftIds: [], rows: 0 };
  return db.transaction(async (tx) => {
    const due = await listDueHandoffs(tx, now, batchSize);
    const result: QueuedHandoffs = { shiftIds: [], rows: 0 };
    for (const shift of due) {
      if (!(await markHandoffQueued(tx, shift.id, now))) continue;
      result.shiftIds.push(shift.id);
      if (nowMs - shift.endsAt.getTime() > staleHandoffMs) continue;
      result.rows += await queueShiftHandoff(tx, shift.id, nowMs, base);
    }
    return result;
  });
}

async function queueShiftHandoff(tx: Tx, shiftId: string, nowMs: number, base: string): Promise<number> {
  const summary = await getHandoffSummary(shiftId, nowMs, tx);
  if (!summary) return 0;
  const recipients = await loadHandoffRecipients(shiftId, summary.shift.endsAtMs, tx);
  if (recipients.length === 0) return 0;
  const url = base + handoffPath(shiftId);
  const counts = {
    received: summary.received.total,
    decisions: summary.decisions.total,
    awaitingDecision: summary.awaitingDecision.total,
    openTasks: summary.openTasks.total,
    missed: summary.missed.total,
  };
  const rows = recipients.map((r) => {
    const { title, body } = handoffText(summary, r.timeZone, url);
    return {
      dedupeKey: handoffDedupeKey(shiftId, r.id),
      userId: r.id,
      channel: "email" as const,
      kind: "handoff",
      title,
      body,
      url,
      payload: { tag: `handoff-${shiftId}`, shiftId, recipientAs: r.as, ...counts },
      status: "pending" as const,
      nextAttemptAt: new Date(nowMs),
      createdAt: new Date(nowMs),
    };
  });
  return insertNotifications(tx, rows, []);
}
