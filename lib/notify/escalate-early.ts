import { and, asc, eq, gt } from "drizzle-orm";
import { escalations } from "@/db/schema";
import type { Tx } from "@/db";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";

/**
 * A page that keeps failing on its channel should not wait out the policy's minutes before someone else is asked:
 * the candidate's next pending escalation step falls due now (the worker fires it on its next cycle, with the
 * usual checks that the candidate is still unanswered), and a `page.failing` event tells coordinators.
 */
export async function escalateEarly(tx: Tx, candidateId: string, now: Date, failure: Record<string, unknown>): Promise<void> {
  const [next] = await tx
    .select({ id: escalations.id, step: escalations.step })
    .from(escalations)
    .where(and(eq(escalations.candidateId, candidateId), eq(escalations.status, "pending"), gt(escalations.dueAt, now)))
    .orderBy(asc(escalations.step))
    .limit(1);
  if (next) await tx.update(escalations).set({ dueAt: now }).where(eq(escalations.id, next.id));
  await appendEvent(tx, {
    at: now,
    kind: eventKinds.pageFailing,
    candidateId,
    data: { ...failure, escalatedStep: next?.step ?? null },
  });
}
