import { getDb, type Tx } from "@/db";
import type { FollowUpTask, TaskState } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { insertTaskReport, readTask, updateTaskVersioned } from "@/lib/data/tasks";
import { eventKinds } from "@/lib/events/kinds";
import { allowedTaskMoves, canMoveTask, taskStateLabels } from "@/lib/triage/task-states";
import { cancelTasks } from "./cancel-tasks";

export interface TaskMoveInput {
  actor: SessionUser;
  taskId: string;
  to: "open" | "observing" | "cancelled";
  reason?: string;
  expectedVersion?: number;
  now?: Date;
}

/**
 * Release (claimed → open), start observing, or cancel (through cancelTasks, as a withdrawal does). The claimer or
 * a coordinator releases and starts. requireRole stays for the demo seed.
 */
export async function moveTask(input: TaskMoveInput): Promise<FollowUpTask> {
  const { actor, taskId, to } = input;
  requireRole(actor, to === "cancelled" ? can.planFollowUp : can.claimTask, to === "cancelled" ? "cancel tasks" : "work on tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
    const now = input.now ?? new Date();
    const task = await readTaskForMove(tx, taskId, to, input.expectedVersion);
    if (to === "cancelled") {
      const [cancelled] = await cancelTasks(tx, { candidateId: task.candidateId, tasks: [task], reason: input.reason ?? "", actorId: actor.id, at: now });
      if (!cancelled) throw new ApiError(409, "the task changed meanwhile; reload");
      return cancelled;
    }
    requireClaimerOrCoordinator(actor, task);
    const updated = await updateTaskVersioned(
      tx,
      task,
      { state: to, ...(to === "open" ? { claimedById: null, claimedAt: null } : { observingAt: now }) },
      now,
    );
    if (!updated) throw new ApiError(409, "the task changed meanwhile; reload");
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.taskStateChanged,
      actorId: actor.id,
      candidateId: task.candidateId,
      taskId,
      fromState: task.state,
      toState: to,
      data: { claimedById: updated.claimedById },
    });
    return updated;
  });
}

/** Records the observer's result; the task is then reported (final). */
export async function reportTask(actor: SessionUser, taskId: string, result: string, now: Date = new Date()): Promise<{ task: FollowUpTask; reportId: string }> {
  requireRole(actor, can.claimTask, "report tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
    const task = await readTaskForMove(tx, taskId, "reported");
    requireClaimerOrCoordinator(actor, task);
    const reportId = await insertTaskReport(tx, { taskId, authorId: actor.id, result, createdAt: now });
    const updated = await updateTaskVersioned(tx, task, { state: "reported", result, reportedAt: now }, now);
    if (!updated) throw new ApiError(409, "the task changed meanwhile; reload");
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.taskReported,
      actorId: actor.id,
      candidateId: task.candidateId,
      taskId,
      fromState: task.state,
      toState: "reported",
      data: { reportId },
    });
    return { task: updated, reportId };
  });
}

async function readTaskForMove(tx: Tx, taskId: string, to: TaskState, expectedVersion?: number): Promise<FollowUpTask> {
  const task = await readTask(tx, taskId);
  if (!task) throw new ApiError(404, "task not found");
  if (expectedVersion !== undefined && expectedVersion !== task.version) {
    throw new ApiError(409, "the task changed since you loaded it", { current: { state: task.state, version: task.version } });
  }
  if (!canMoveTask(task.state, to)) {
    const status = task.state === "reported" || task.state === "cancelled" ? 409 : 422;
    throw new ApiError(status, `a task that is ${taskStateLabels[task.state].toLowerCase()} cannot become ${taskStateLabels[to].toLowerCase()}`, {
      from: task.state,
      to,
      allowed: allowedTaskMoves[task.state],
    });
  }
  return task;
}

function requireClaimerOrCoordinator(actor: SessionUser, task: FollowUpTask): void {
  if (actor.role !== "coordinator" && task.claimedById !== actor.id) {
    throw new ApiError(403, "only the observer who claimed this task (or a coordinator) may do that");
  }
}
