import { getDb } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { claimOpenTask, readTaskHolder, readTaskSiteFor } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { taskStateLabels } from "@/lib/triage/task-states";

/**
 * Claims an open task. The conditional UPDATE inside a write transaction decides: exactly one of several
 * simultaneous claims wins; the others get 409 with who holds the task. requireRole stays for the demo seed.
 * Observers claim tasks for their own sites (and "any site" tasks); coordinators claim any: checked inside the same
 * transaction (a task's site never changes after planning, so the read cannot go stale before the UPDATE).
 */
export async function claimTask(actor: SessionUser, taskId: string, now: Date = new Date()): Promise<FollowUpTask> {
  requireRole(actor, can.claimTask, "claim tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
    if (actor.role !== "coordinator") {
      const site = await readTaskSiteFor(tx, taskId, actor.id);
      if (site && site.siteId !== null && !site.observesThere) {
        throw new ApiError(
          403,
          `this task is for ${site.siteCode ?? "another site"}, which is not one of your sites; a coordinator may claim it or add you to the site`,
          { siteId: site.siteId },
        );
      }
    }
    const won = await claimOpenTask(tx, taskId, actor.id, now);
    if (!won) {
      const holder = await readTaskHolder(tx, taskId);
      if (!holder) throw new ApiError(404, "task not found");
      const { claimedBy, state } = holder;
      if (claimedBy) throw new ApiError(409, `${claimedBy.name} already claimed this task`, { claimedBy, state });
      throw new ApiError(409, `the task is ${taskStateLabels[state].toLowerCase()}, not open`, { claimedBy, state });
    }
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.taskStateChanged,
      actorId: actor.id,
      candidateId: won.candidateId,
      taskId,
      fromState: "open",
      toState: "claimed",
      data: { claimedById: actor.id },
    });
    return won;
  });
}
