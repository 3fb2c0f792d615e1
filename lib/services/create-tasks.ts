import { getDb } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { findSiteIds, insertTasks } from "@/lib/data/tasks";
import { readCandidateRow } from "@/lib/data/triggers";
import { eventKinds } from "@/lib/events/kinds";
import { onTasksCreated } from "@/lib/notify/hooks";
import { windowAheadIssues, type TaskDraft } from "@/lib/validations/tasks";

/**
 * Plans follow-up tasks for a candidate in Pursue: the tasks and their audit events, then paging tells observers
 * who follow these sites, committed with them. requireRole stays because the demo seed calls this too.
 */
export async function createTasks(actor: SessionUser, candidateId: string, drafts: TaskDraft[], now: Date = new Date()): Promise<FollowUpTask[]> {
  requireRole(actor, can.planFollowUp, "plan follow-up");
  const db = await getDb();
  return db.transaction(async (tx) => {
    const candidate = await readCandidateRow(tx, candidateId);
    if (!candidate) throw new ApiError(404, "candidate not found");
    if (candidate.stage === "withdrawn") throw new ApiError(422, "the feed withdrew this candidate; no new tasks");
    if (candidate.triageState !== "pursue") {
      throw new ApiError(422, "move the candidate to Pursue before planning follow-up", { triageState: candidate.triageState });
    }
    const tooFar = windowAheadIssues(drafts, now);
    if (tooFar.length) throw new ApiError(422, tooFar[0]?.message ?? "window too far ahead", { issues: tooFar });
    const siteIds = [...new Set(drafts.map((d) => d.siteId).filter((id): id is string => Boolean(id)))];
    const known = await findSiteIds(tx, siteIds);
    const missing = siteIds.filter((id) => !known.includes(id));
    if (missing.length) throw new ApiError(422, `unknown site: ${missing.join(", ")}`);
    const created = await insertTasks(
      tx,
      drafts.map((d) => ({ ...d, candidateId, createdById: actor.id, createdAt: now, updatedAt: now })),
    );
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
    if (firstEventId !== null) await onTasksCreated(tx, { candidateId, eventId: firstEventId, taskIds: created.map((t) => t.id) });
    return created;
  });
}
