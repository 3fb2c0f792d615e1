import { and, eq, isNull, lte } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { notifications, shifts } from "@/db/schema";
import { loadDecisions, loadHandoffRecipients, loadLiveTasks, loadShift } from "@/lib/data/review";
import { appBaseUrl } from "@/lib/notify/links";
import { buildHandoffSummary, handoffText, type HandoffSummary } from "./handoff-summary";
import { loadReviewScope } from "./report";

/** A shift that ended longer ago than this gets no e-mail (e.g. the first run over an old rota); it is only marked. */
export const staleHandoffMs = 12 * 3_600_000;
/** Shifts handled per call, so one write transaction stays short. */
const batchSize = 20;

export const handoffPath = (shiftId: string) => `/review/handoff/${encodeURIComponent(shiftId)}`;
export const handoffDedupeKey = (shiftId: string, userId: string) => `handoff:${shiftId}:${userId}`;

/** The end-of-shift summary as of `nowMs` (the printable page and the JSON read it; the e-mails carry it). */
export async function getHandoffSummary(shiftId: string, nowMs: number, q?: Tx): Promise<HandoffSummary | null> {
  const shift = await loadShift(shiftId, q);
  if (!shift) return null;
  const scope = await loadReviewScope({ fromMs: shift.startsAtMs, toMs: shift.endsAtMs, nowMs, timeZone: "UTC" }, q);
  // Without a shift filter the scope always exists; the guard only satisfies the type.
  if (!scope) return null;
  const decisions = await loadDecisions(shift.startsAtMs, shift.endsAtMs, q);
  const liveTasks = await loadLiveTasks(50, q);
  return buildHandoffSummary({ shift, builtAtMs: nowMs, rows: scope.rows, deadlinesMs: scope.deadlinesMs, decisions, liveTasks });
}

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
  const [anyDue] = await db
    .select({ id: shifts.id })
    .from(shifts)
    .where(and(isNull(shifts.handoffQueuedAt), lte(shifts.endsAt, now)))
    .limit(1);
  if (!anyDue) return { shiftIds: [], rows: 0 };
  return db.transaction(async (tx) => {
    const due = await tx
      .select({ id: shifts.id, endsAt: shifts.endsAt })
      .from(shifts)
      .where(and(isNull(shifts.handoffQueuedAt), lte(shifts.endsAt, now)))
      .orderBy(shifts.endsAt)
      .limit(batchSize);
    const result: QueuedHandoffs = { shiftIds: [], rows: 0 };
    for (const shift of due) {
      const marked = await tx
        .update(shifts)
        .set({ handoffQueuedAt: now })
        .where(and(eq(shifts.id, shift.id), isNull(shifts.handoffQueuedAt)))
        .returning({ id: shifts.id });
      if (marked.length === 0) continue;
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
  const inserted = await tx.insert(notifications).values(rows).onConflictDoNothing({ target: notifications.dedupeKey }).returning({ id: notifications.id });
  return inserted.length;
}
