import { and, asc, eq, gt, lte } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { escalations } from "@/db/schema";

/* Escalation timers: the later steps of a candidate's call-out ladder, stored when it is first paged. */

export type EscalationTimer = typeof escalations.$inferSelect;

const due = (now: Date) => and(eq(escalations.status, "pending"), lte(escalations.dueAt, now));

/** Stores the later steps; a step stored before (a replay) is left as it is. */
export async function insertEscalationTimers(tx: Tx, candidateId: string, steps: Array<{ step: number; target: string; dueAt: Date }>, now: Date): Promise<void> {
  if (steps.length === 0) return;
  await tx
    .insert(escalations)
    .values(steps.map((s) => ({ candidateId, step: s.step, target: s.target, dueAt: s.dueAt, createdAt: now })))
    .onConflictDoNothing();
}

/** Cancels a candidate's timers still waiting; returns how many. */
export async function cancelPendingEscalations(tx: Tx, candidateId: string): Promise<number> {
  const stopped = await tx
    .update(escalations)
    .set({ status: "cancelled", firedAt: null, lockedBy: null, lockedUntil: null })
    .where(and(eq(escalations.candidateId, candidateId), eq(escalations.status, "pending")))
    .returning({ id: escalations.id });
  return stopped.length;
}

/** Brings the candidate's next pending step (due after `now`) forward to now; returns its step number, or null. */
export async function bringNextStepForward(tx: Tx, candidateId: string, now: Date): Promise<number | null> {
  const [next] = await tx
    .select({ id: escalations.id, step: escalations.step })
    .from(escalations)
    .where(and(eq(escalations.candidateId, candidateId), eq(escalations.status, "pending"), gt(escalations.dueAt, now)))
    .orderBy(asc(escalations.step))
    .limit(1);
  if (!next) return null;
  await tx.update(escalations).set({ dueAt: now }).where(eq(escalations.id, next.id));
  return next.step;
}

/** Is any timer due? A plain read, so an idle worker never takes the write lock. */
export async function anyEscalationDue(now: Date): Promise<boolean> {
  const db = await getDb();
  const [any] = await db.select({ id: escalations.id }).from(escalations).where(due(now)).limit(1);
  return Boolean(any);
}

/** Due timers, earliest first. */
export async function listDueEscalations(tx: Tx, now: Date, limit: number): Promise<EscalationTimer[]> {
  return tx.select().from(escalations).where(due(now)).orderBy(asc(escalations.dueAt)).limit(limit);
}

/** Closes a timer as fired (at `firedAt`) or cancelled, by the worker that handled it. */
export async function closeEscalation(tx: Tx, id: string, workerId: string, outcome: { status: "fired"; firedAt: Date } | { status: "cancelled" }): Promise<void> {
  const set = outcome.status === "fired" ? { status: "fired" as const, firedAt: outcome.firedAt, lockedBy: workerId } : { status: "cancelled" as const, lockedBy: workerId };
  await tx.update(escalations).set(set).where(eq(escalations.id, id));
}
