import { getDb } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { claimOpenTask, readTaskHolder } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { taskStateLabels } from "@/lib/triage/task-states";

/**
 * Claims an open task. The conditional UPDATE inside a write transaction decides: exactly one of several
 * simultaneous claims wins; the others get 409 with who holds the task. requireRole stays for the demo seed.
 */
export async function claimTask(actor: SessionUser, taskId: string, now: Date = new Date()): Promise<FollowUpTask> {
  requireRole(actor, can.claimTask, "claim tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
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
