import { and, asc, desc, eq, inArray, or, sql, type SQL } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import {
  candidates,
  followUpTasks,
  siteObservers,
  sites,
  taskReports,
  users,
  type FollowUpTask,
  type NewFollowUpTask,
  type TaskState,
} from "@/db/schema";
import type { SessionUser } from "@/lib/auth/roles";
import type { TaskListQuery } from "@/lib/validations/tasks";
import { taskPlanSummaries, type TaskPlanSummary } from "./plans";

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
  /** the task's current pointing plan, in short; null without one */
  plan: TaskPlanSummary | null;
}

/** States a task is still being worked in: a withdrawal or a cancellation ends them. */
export const unfinishedTaskStates = ["open", "claimed", "observing"] as const satisfies readonly TaskState[];

/** The follow-up board's cards in one query (site, candidate and claimer joined), urgent first. */
export async function listTasks(
  query: Partial<TaskListQuery> & {
    /** exactly this candidate (the candidate's own task list), unlike `candidate`, which also matches id fragments */
    candidateId?: string;
    /** exactly this task (the task's own view) */
    taskId?: string;
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
  if (query.taskId !== undefined) where.push(eq(followUpTasks.id, query.taskId));
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
  const planOf = await taskPlanSummaries(db, rows.map((r) => r.task.id));
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
    plan: planOf.get(task.id) ?? null,
  }));
}

export async function listSiteOptions(): Promise<Array<{ id: string; code: string; name: string }>> {
  const db = await getDb();
  return db.select({ id: sites.id, code: sites.code, name: sites.name }).from(sites).orderBy(asc(sites.code));
}

/** Which of these site ids exist. */
export async function findSiteIds(tx: Tx, siteIds: string[]): Promise<string[]> {
  if (siteIds.length === 0) return [];
  const rows = await tx.select({ id: sites.id }).from(sites).where(inArray(sites.id, siteIds));
  return rows.map((row) => row.id);
}

export async function insertTasks(tx: Tx, rows: NewFollowUpTask[]): Promise<FollowUpTask[]> {
  return tx.insert(followUpTasks).values(rows).returning();
}

export async function readTask(tx: Tx, taskId: string): Promise<FollowUpTask | null> {
  const [task] = await tx.select().from(followUpTasks).where(eq(followUpTasks.id, taskId)).limit(1);
  return task ?? null;
}

/**
 * Claims an open task with one conditional UPDATE (`where state = 'open'`): of several simultaneous claims exactly
 * one gets the row back; the others get null.
 */
export async function claimOpenTask(tx: Tx, taskId: string, claimerId: string, now: Date): Promise<FollowUpTask | null> {
  const [won] = await tx
    .update(followUpTasks)
    .set({ state: "claimed", claimedById: claimerId, claimedAt: now, updatedAt: now, version: sql`${followUpTasks.version} + 1` })
    .where(and(eq(followUpTasks.id, taskId), eq(followUpTasks.state, "open")))
    .returning();
  return won ?? null;
}

/** A task's state and who holds it (for a refused claim), or null when there is no such task. */
export async function readTaskHolder(
  tx: Tx,
  taskId: string,
): Promise<{ state: TaskState; claimedBy: { id: string; name: string } | null } | null> {
  const [row] = await tx
    .select({ state: followUpTasks.state, claimerId: users.id, claimerName: users.name })
    .from(followUpTasks)
    .leftJoin(users, eq(users.id, followUpTasks.claimedById))
    .where(eq(followUpTasks.id, taskId))
    .limit(1);
  if (!row) return null;
  return { state: row.state, claimedBy: row.claimerId ? { id: row.claimerId, name: row.claimerName ?? "someone" } : null };
}

/** A task's site and whether `userId` observes at it (null when there is no such task). */
export async function readTaskSiteFor(
  tx: Tx,
  taskId: string,
  userId: string,
): Promise<{ siteId: string | null; siteCode: string | null; observesThere: boolean } | null> {
  const [row] = await tx
    .select({ siteId: followUpTasks.siteId, siteCode: sites.code, follows: siteObservers.userId })
    .from(followUpTasks)
    .leftJoin(sites, eq(sites.id, followUpTasks.siteId))
    .leftJoin(siteObservers, and(eq(siteObservers.siteId, followUpTasks.siteId), eq(siteObservers.userId, userId)))
    .where(eq(followUpTasks.id, taskId))
    .limit(1);
  if (!row) return null;
  return { siteId: row.siteId, siteCode: row.siteCode, observesThere: row.follows !== null };
}

export type TaskChanges = Partial<
  Pick<FollowUpTask, "state" | "claimedById" | "claimedAt" | "observingAt" | "cancelledAt" | "reportedAt" | "result">
>;

/** Applies a change if nobody wrote the task since `task` was read (optimistic concurrency); null when someone did. */
export async function updateTaskVersioned(
  tx: Tx,
  task: Pick<FollowUpTask, "id" | "version">,
  changes: TaskChanges,
  now: Date,
): Promise<FollowUpTask | null> {
  const [updated] = await tx
    .update(followUpTasks)
    .set({ ...changes, updatedAt: now, version: sql`${followUpTasks.version} + 1` })
    .where(and(eq(followUpTasks.id, task.id), eq(followUpTasks.version, task.version)))
    .returning();
  return updated ?? null;
}

export async function insertTaskReport(tx: Tx, row: { taskId: string; authorId: string; result: string; createdAt: Date }): Promise<string> {
  const [report] = await tx.insert(taskReports).values(row).returning({ id: taskReports.id });
  if (!report) throw new Error("report insert returned nothing");
  return report.id;
}

/** A candidate's tasks that are still being worked (open, claimed or observing). */
export async function listUnfinishedTasks(tx: Tx, candidateId: string): Promise<FollowUpTask[]> {
  return tx
    .select()
    .from(followUpTasks)
    .where(and(eq(followUpTasks.candidateId, candidateId), inArray(followUpTasks.state, unfinishedTaskStates)));
}

/**
 * Cancels these tasks in one UPDATE, each only if nobody wrote it since it was read (its version) and it is still
 * unfinished; answers the rows it cancelled.
 */
export async function cancelTaskRows(tx: Tx, tasks: Array<Pick<FollowUpTask, "id" | "version">>, now: Date): Promise<FollowUpTask[]> {
  if (tasks.length === 0) return [];
  const unchanged = or(...tasks.map((task) => and(eq(followUpTasks.id, task.id), eq(followUpTasks.version, task.version))));
  return tx
    .update(followUpTasks)
    .set({ state: "cancelled", cancelledAt: now, updatedAt: now, version: sql`${followUpTasks.version} + 1` })
    .where(and(unchanged, inArray(followUpTasks.state, unfinishedTaskStates)))
    .returning();
}

/** Of the given task ids, those of the candidate, with their site's code (what a "new tasks" message lists). */
export async function tasksWithSiteCodes(
  tx: Tx,
  candidateId: string,
  taskIds: string[],
): Promise<
  Array<{ id: string; siteId: string | null; kind: FollowUpTask["kind"]; siteCode: string | null; priority: number; notes: string; windowStart: Date | null; windowEnd: Date | null }>
> {
  if (taskIds.length === 0) return [];
  return tx
    .select({
      id: followUpTasks.id,
      siteId: followUpTasks.siteId,
      kind: followUpTasks.kind,
      siteCode: sites.code,
      priority: followUpTasks.priority,
      notes: followUpTasks.notes,
      windowStart: followUpTasks.windowStart,
      windowEnd: followUpTasks.windowEnd,
    })
    .from(followUpTasks)
    .leftJoin(sites, eq(sites.id, followUpTasks.siteId))
    .where(and(inArray(followUpTasks.id, taskIds), eq(followUpTasks.candidateId, candidateId)));
}
