import { getDb } from "@/db";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { readPointingFor, readPlan, setPointingDone } from "@/lib/data/plans";
import { readTaskHolder } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { toPlanRecord, type PointingRecord } from "@/lib/plans/record";
import { recordTickedPointing, withdrawTickedPointing } from "@/lib/services/record-observations";
import type { PointingTick } from "@/lib/validations/plans";

/**
 * Ticks a planned pointing done (or takes the tick back): who and when stored on the pointing, one audit event,
 * in one transaction. Observers tick at the plan's site or on a task they hold; coordinators anywhere (the route's
 * role list). A closed plan (replaced, or its task cancelled) is 409. Ticking done also records the exposure (at
 * the planned position with the plan's instrument defaults, lib/services/record-observations.ts); taking the tick
 * back removes it, so coverage follows the ticks.
 */
export async function tickPointing(actor: SessionUser, planId: string, pointingId: string, tick: PointingTick, now: Date): Promise<PointingRecord> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const found = await readPointingFor(tx, planId, pointingId, actor.id);
    if (!found) throw new ApiError(404, "pointing not found in this plan");
    if (actor.role === "observer" && !found.observesThere) {
      const holder = found.taskId ? await readTaskHolder(tx, found.taskId) : null;
      if (holder?.claimedBy?.id !== actor.id) throw new ApiError(403, "observers tick pointings at their own sites or on tasks they hold");
    }
    if (found.closed) throw new ApiError(409, "this plan was replaced or its task cancelled; open the current plan");
    const wasDone = found.pointing.doneAt !== null;
    if (wasDone !== tick.done) {
      await setPointingDone(tx, pointingId, tick.done ? { at: now, byId: actor.id } : null);
      await appendEvent(tx, {
        at: now,
        kind: eventKinds.pointingDone,
        actorId: actor.id,
        candidateId: found.candidateId,
        taskId: found.taskId,
        data: { planId, pointingId, index: found.pointing.index, done: tick.done },
      });
      const stored = await readPlan(tx, planId);
      if (stored) {
        const tile = { candidateId: found.candidateId, taskId: found.taskId, plan: stored.plan, pointing: found.pointing };
        if (tick.done) await recordTickedPointing(tx, actor, tile, now);
        else await withdrawTickedPointing(tx, actor, tile, now);
      }
    }
    const plan = await readPlan(tx, planId);
    const record = plan ? toPlanRecord(plan).pointings.find((p) => p.id === pointingId) : undefined;
    if (!record) throw new Error("pointing vanished inside its own transaction");
    return record;
  });
}
