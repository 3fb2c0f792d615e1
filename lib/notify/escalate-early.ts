import type { Tx } from "@/db";
import { bringNextStepForward } from "@/lib/data/escalations";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";

/**
 * A page that keeps failing on its channel should not wait out the policy's minutes before someone else is asked:
 * the candidate's next pending escalation step falls due now (the worker fires it on its next cycle, with the
 * usual checks that the candidate is still unanswered), and a `page.failing` event tells coordinators.
 */
export async function escalateEarly(tx: Tx, candidateId: string, now: Date, failure: Record<string, unknown>): Promise<void> {
  const escalatedStep = await bringNextStepForward(tx, candidateId, now);
  await appendEvent(tx, {
    at: now,
    kind: eventKinds.pageFailing,
    candidateId,
    data: { ...failure, escalatedStep },
  });
}
