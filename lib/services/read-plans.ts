import { getDb } from "@/db";
import { ApiError } from "@/lib/api/errors";
import { listCandidatePlans, listPlanInstruments, listTaskPlans, observerSiteIds, readPlan } from "@/lib/data/plans";
import { readCandidateRow } from "@/lib/data/triggers";
import { toPlanRecord, type PlanRecord } from "@/lib/plans/record";
import type { SessionUser } from "@/lib/auth/roles";
import { footprintAreaDeg2 } from "@/lib/validations/instruments";

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

/** The instruments a person may plan with: every one for shifters and coordinators, their own sites' for observers. */
export async function getPlanInstrumentOptions(user: SessionUser): Promise<Array<{ id: string; name: string; siteCode: string; areaDeg2: number }>> {
  const db = await getDb();
  const all = await listPlanInstruments(db);
  const own = user.role === "observer" ? new Set(await observerSiteIds(db, user.id)) : null;
  return all.filter((i) => !own || own.has(i.siteId)).map((i) => ({ id: i.id, name: i.name, siteCode: i.siteCode, areaDeg2: footprintAreaDeg2(i.footprint) }));
}
