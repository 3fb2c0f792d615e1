import { and, eq, isNull, lte } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { shifts } from "@/db/schema";

/* Which shifts have had their end-of-shift summary queued (shifts.handoff_queued_at). */

const due = (now: Date) => and(isNull(shifts.handoffQueuedAt), lte(shifts.endsAt, now));

/** Has any shift ended without its summary queued? A plain read, so an idle worker never takes the write lock. */
export async function anyHandoffDue(now: Date): Promise<boolean> {
  const db = await getDb();
  const [row] = await db.select({ id: shifts.id }).from(shifts).where(due(now)).limit(1);
  return Boolean(row);
}

/** Ended shifts without a queued summary, earliest end first. */
export async function listDueHandoffs(tx: Tx, now: Date, limit: number): Promise<Array<{ id: string; endsAt: Date }>> {
  return tx.select({ id: shifts.id, endsAt: shifts.endsAt }).from(shifts).where(due(now)).orderBy(shifts.endsAt).limit(limit);
}

/** Marks a shift's summary queued; false when another worker marked it first (a conditional UPDATE). */
export async function markHandoffQueued(tx: Tx, shiftId: string, now: Date): Promise<boolean> {
  const marked = await tx
    .update(shifts)
    .set({ handoffQueuedAt: now })
    .where(and(eq(shifts.id, shiftId), isNull(shifts.handoffQueuedAt)))
    .returning({ id: shifts.id });
  return marked.length > 0;
}
