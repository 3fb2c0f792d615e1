import { and, asc, desc, eq, inArray, or, sql, type SQL } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import {
  candidates,
  followUpTasks,
  sites,
  taskReports,
  users,
  type FollowUpTask,
  type TaskState,
} from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { eventKinds } from "@/lib/events/kinds";
import { onTasksCancelled, onTasksCreated } from "@/lib/notify/hooks";
import { allowedTaskMoves, canMoveTask, taskStateLabels } from "@/lib/triage/task-states";
import type { TaskDraft, TaskListQuery } from "@/lib/validations/tasks";
import { appendEvent } from "./events";

export interface TaskCard {
  id: string;
  kind: FollowUpTask["kind"];
  state: TaskState;
  priority: number;
  notes: string;
  result: string | null;
  windowStart: string | null;
  windowEnd: string | null;
  createdAt: string;
  updatedAt: string;
  version: number;
  candidate: { id: string; externalId: string; stage: string; withdrawn: boolean };
  site: { id: string; code: string; name: string } | null;
  claimedBy: { id: string; name: string; initials: string } | null;
}

/** The follow-up board's cards in one query (site, candidate and claimer joined), urgent first. */
export async function listTasks(
  query: Partial<TaskListQuery> & {
    /** exactly this candidate (the candidate's own task list), unlike `candidate`, which also matches id fragments */
    candidateId?: string;
  },
  viewer: SessionUser,
): Promise<TaskCard[]> {
  const db = await getDb();
  const where: SQL[] = [];
  if (query.site) where.push(or(eq(sites.id, query.site), eq(sites.code, query.site)) as SQL);
  if (query.kind) where.push(eq(followUpTasks.kind, query.kind));
  if (query.state) where.push(eq(followUpTasks.state, query.state));
  if (query.mine) where.push(eq(followUpTasks.claimedById, viewer.id));
  if (query.candidateId !== undefined) where.push(eq(followUpTasks.candidateId, query.candidateId));
  if (query.candidate) {
    where.push(
      or(eq(candidates.id, query.candidate), sql`instr(lower(${candidates.externalId}), lower(${query.candidate})) > 0`) as SQL,
    );
  }
  const rows = await db
    .select({
      task: followUpTasks,
      candidate: {
        id: candidates.id,
        externalId: candidates.externalId,
        stage: candidates.stage,
        withdrawnAt: candidates.withdrawnAt,
      },
      site: { id: sites.id, code: sites.code, name: sites.name },
      claimer: { id: users.id, name: users.name, initials: users.initials },
    })
    .from(followUpTasks)
    .innerJoin(candidates, eq(candidates.id, followUpTasks.candidateId))
    .leftJoin(sites, eq(sites.id, followUpTasks.siteId))
    .leftJoin(users, eq(users.id, followUpTasks.claimedById))
    .where(where.length ? and(...where) : undefined)
    .orderBy(asc(followUpTasks.priority), desc(followUpTasks.createdAt))
    .limit(1000);
  return rows.map(({ task, candidate, site, claimer }) => ({
    id: task.id,
    kind: task.kind,
    state: task.state,
    priority: task.priority,
    notes: task.notes,
    result: task.result,
    windowStart: task.windowStart?.toISOString() ?? null,
    windowEnd: task.windowEnd?.toISOString() ?? null,
    createdAt: task.createdAt.toISOString(),
    updatedAt: task.updatedAt.toISOString(),
    version: task.version,
    candidate: {
      id: candidate.id,
      externalId: candidate.externalId,
      stage: candidate.stage,
      withdrawn: candidate.stage === "withdrawn" || candidate.withdrawnAt !== null,
    },
    site: site?.id ? site : null,
    claimedBy: claimer?.id ? claimer : null,
  }));
}

export async function listSiteOptions(): Promise<Array<{ id: string; code: string; name: string }>> {
  const db = await getDb();
  return db.select({ id: sites.id, code: sites.code, name: sites.name }).from(sites).orderBy(asc(sites.code));
}

/** Creates follow-up tasks for a candidate that is going for follow-up, each with its audit event. */
export async function createTasks(
  actor: SessionUser,
  candidateId: string,
  drafts: TaskDraft[],
  now: Date = new Date(),
): Promise<FollowUpTask[]> {
  requireRole(actor, can.planFollowUp, "plan follow-up");
  const db = await getDb();
  return db.transaction(async (tx) => {
      const [candidate] = await tx.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
      if (!candidate) throw new ApiError(404, "candidate not found");
      if (candidate.stage === "withdrawn") throw new ApiError(422, "the feed withdrew this candidate; no new tasks");
      if (candidate.triageState !== "pursue") {
        throw new ApiError(422, "move the candidate to Pursue before planning follow-up", {
          triageState: candidate.triageState,
        });
      }
      const siteIds = [...new Set(drafts.map((d) => d.siteId).filter((id): id is string => Boolean(id)))];
      if (siteIds.length) {
        const known = await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, siteIds));
        const missing = siteIds.filter((id) => !known.some((k) => k.id === id));
        if (missing.length) throw new ApiError(422, `unknown site: ${missing.join(", ")}`);
      }
      const created = await tx
        .insert(followUpTasks)
        .values(drafts.map((d) => ({ ...d, candidateId, createdById: actor.id, createdAt: now, updatedAt: now })))
        .returning();
      let firstEventId: number | null = null;
      for (const task of created) {
        const event = await appendEvent(tx, {
          at: now,
          kind: eventKinds.taskCreated,
          actorId: actor.id,
          candidateId,
          taskId: task.id,
          toState: task.state,
          data: { kind: task.kind, siteId: task.siteId, priority: task.priority },
        });
        firstEventId ??= event.id;
      }
      // Observers who follow these sites hear about the new tasks, committed with them.
      if (firstEventId !== null) await onTasksCreated(tx, { candidateId, eventId: firstEventId, taskIds: created.map((t) => t.id) });
      return created;
    });
}

/**
 * Claims an open task. One conditional UPDATE (`where state = 'open'`) inside a write transaction decides: exactly
 * one of several simultaneous claims wins; the others get 409 with who holds the task.
 */
export async function claimTask(actor: SessionUser, taskId: string, now: Date = new Date()): Promise<FollowUpTask> {
  requireRole(actor, can.claimTask, "claim tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
      const [won] = await tx
        .update(followUpTasks)
        .set({
          state: "claimed",
          claimedById: actor.id,
          claimedAt: now,
          updatedAt: now,
          version: sql`${followUpTasks.version} + 1`,
        })
        .where(and(eq(followUpTasks.id, taskId), eq(followUpTasks.state, "open")))
        .returning();
      if (!won) throw await claimRefusal(tx, taskId);
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

async function claimRefusal(tx: Tx, taskId: string): Promise<ApiError> {
  const [row] = await tx
    .select({ state: followUpTasks.state, claimerId: users.id, claimerName: users.name })
    .from(followUpTasks)
    .leftJoin(users, eq(users.id, followUpTasks.claimedById))
    .where(eq(followUpTasks.id, taskId))
    .limit(1);
  if (!row) return new ApiError(404, "task not found");
  const claimedBy = row.claimerId ? { id: row.claimerId, name: row.claimerName ?? "someone" } : null;
  if (claimedBy) return new ApiError(409, `${claimedBy.name} already claimed this task`, { claimedBy, state: row.state });
  return new ApiError(409, `the task is ${taskStateLabels[row.state].toLowerCase()}, not open`, { claimedBy, state: row.state });
}

export interface TaskMoveInput {
  actor: SessionUser;
  taskId: string;
  to: "open" | "observing" | "cancelled";
  reason?: string;
  expectedVersion?: number;
  now?: Date;
}

/** Release (claimed → open), start observing, or cancel. The claimer or a coordinator releases and starts. */
export async function moveTask(input: TaskMoveInput): Promise<FollowUpTask> {
  const { actor, taskId, to } = input;
  requireRole(actor, to === "cancelled" ? can.planFollowUp : can.claimTask, to === "cancelled" ? "cancel tasks" : "work on tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
      const now = input.now ?? new Date();
      const task = await readTaskForMove(tx, taskId, to, input.expectedVersion);
      if (to !== "cancelled") requireClaimerOrCoordinator(actor, task);
      const [updated] = await tx
        .update(followUpTasks)
        .set({
          state: to,
          updatedAt: now,
          version: sql`${followUpTasks.version} + 1`,
          ...(to === "open" ? { claimedById: null, claimedAt: null } : {}),
          ...(to === "observing" ? { observingAt: now } : {}),
          ...(to === "cancelled" ? { cancelledAt: now } : {}),
        })
        .where(and(eq(followUpTasks.id, taskId), eq(followUpTasks.version, task.version)))
        .returning();
      if (!updated) throw new ApiError(409, "the task changed meanwhile; reload");
      const event = await appendEvent(tx, {
        at: now,
        kind: to === "cancelled" ? eventKinds.taskCancelled : eventKinds.taskStateChanged,
        actorId: actor.id,
        candidateId: task.candidateId,
        taskId,
        fromState: task.state,
        toState: to,
        data: to === "cancelled" ? { reason: input.reason ?? "" } : { claimedById: updated.claimedById },
      });
      if (to === "cancelled") {
        await onTasksCancelled(tx, {
          candidateId: task.candidateId,
          eventId: event.id,
          ownerIds: task.claimedById ? [task.claimedById] : [],
          taskIds: [taskId],
          reason: input.reason ?? "",
        });
      }
      return updated;
    });
}

/** Records the observer's result; the task is then reported (final). */
export async function reportTask(
  actor: SessionUser,
  taskId: string,
  result: string,
  now: Date = new Date(),
): Promise<{ task: FollowUpTask; reportId: string }> {
  requireRole(actor, can.claimTask, "report tasks");
  const db = await getDb();
  return db.transaction(async (tx) => {
      const task = await readTaskForMove(tx, taskId, "reported");
      requireClaimerOrCoordinator(actor, task);
      const [report] = await tx
        .insert(taskReports)
        .values({ taskId, authorId: actor.id, result, createdAt: now })
        .returning({ id: taskReports.id });
      if (!report) throw new Error("report insert returned nothing");
      const [updated] = await tx
        .update(followUpTasks)
        .set({ state: "reported", result, reportedAt: now, updatedAt: now, version: sql`${followUpTasks.version} + 1` })
        .where(and(eq(followUpTasks.id, taskId), eq(followUpTasks.version, task.version)))
        .returning();
      if (!updated) throw new ApiError(409, "the task changed meanwhile; reload");
      await appendEvent(tx, {
        at: now,
        kind: eventKinds.taskReported,
        actorId: actor.id,
        candidateId: task.candidateId,
        taskId,
        fromState: task.state,
        toState: "reported",
        data: { reportId: report.id },
      });
      return { task: updated, reportId: report.id };
    });
}

async function readTaskForMove(tx: Tx, taskId: string, to: TaskState, expectedVersion?: number): Promise<FollowUpTask> {
  const [task] = await tx.select().from(followUpTasks).where(eq(followUpTasks.id, taskId)).limit(1);
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
