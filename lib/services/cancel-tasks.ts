import { ApiError } from "@/lib/api/errors";
import type { Tx } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { appendEvent } from "@/lib/data/events";
import { closePlansOfTasks } from "@/lib/data/plans";
import { cancelTaskRows } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { onTasksCancelled } from "@/lib/notify/hooks";

export interface CancelTasksInput {
  candidateId: string;
  /** the tasks as read in this transaction: each is cancelled only if its version is still the one read */
  tasks: Array<Pick<FollowUpTask, "id" | "state" | "version" | "claimedById">>;
  reason: string;
  /** who cancelled; null for the feed's withdrawal */
  actorId: string | null;
  at: Date;
  /** the event the owners' pages point at (a withdrawal's); else the first task's cancellation event */
  causeEventId?: number;
}

/**
 * The one way tasks are cancelled, for a coordinator's move and for the feed's withdrawal alike: the rows, one
 * taskCancelled event each, then paging tells whoever held them. Inside the caller's transaction; a task written
 * since it was read is a 409 (the caller's transaction rolls back whole).
 */
export async function cancelTasks(tx: Tx, input: CancelTasksInput): Promise<FollowUpTask[]> {
  if (input.tasks.length === 0) return [];
  const cancelled = await cancelTaskRows(tx, input.tasks, input.at);
  if (cancelled.length !== input.tasks.length) throw new ApiError(409, "the task changed meanwhile; reload");
  // their pointing plans no longer hold sky for other sites' plans
  await closePlansOfTasks(tx, input.tasks.map((t) => t.id), input.at);
  let firstEventId: number | null = null;
  for (const task of input.tasks) {
    const event = await appendEvent(tx, {
      at: input.at,
      kind: eventKinds.taskCancelled,
      actorId: input.actorId,
      candidateId: input.candidateId,
      taskId: task.id,
      fromState: task.state,
      toState: "cancelled",
      data: { reason: input.reason, ownerId: task.claimedById },
    });
    firstEventId ??= event.id;
  }
  const eventId = input.causeEventId ?? firstEventId;
  if (eventId === null) throw new Error("cancelled tasks without an event");
  const ownerIds = [...new Set(input.tasks.flatMap((task) => (task.claimedById ? [task.claimedById] : [])))];
  await onTasksCancelled(tx, {
    candidateId: input.candidateId,
    eventId,
    ownerIds,
    taskIds: input.tasks.map((task) => task.id),
    reason: input.reason,
  });
  // Answered in the caller's order, so one task's caller gets its row back.
  return input.tasks.map((task) => cancelled.find((row) => row.id === task.id) as FollowUpTask);
}
