import { getDb } from "@/db";
import { ApiError } from "@/lib/api/errors";
import { listCandidatePlans, listTaskPlans, readPlan } from "@/lib/data/plans";
import { readCandidateRow } from "@/lib/data/triggers";
import { toPlanRecord, type PlanRecord } from "@/lib/plans/record";

/** One plan with its pointings; 404 when there is none. */
export async function getPlan(planId: string): Promise<PlanRecord> {
  const db = await getDb();
  const stored = await readPlan(db, planId);
  if (!stored) throw new ApiError(404, "plan not found");
  return toPlanRecord(stored);
}

/** A candidate's plans, newest first; 404 for an unknown candidate. */
export async function getCandidatePlans(candidateId: string): Promise<PlanRecord[]> {
  const db = await getDb();
  if (!(await readCandidateRow(db, candidateId))) throw new ApiError(404, "candidate not found");
  return (await listCandidatePlans(db, candidateId)).map(toPlanRecord);
}

/** The plans attached to these tasks, newest first. */
export async function getTaskPlans(taskIds: string[]): Promise<PlanRecord[]> {
  const db = await getDb();
  return (await listTaskPlans(db, taskIds)).map(toPlanRecord);
}
