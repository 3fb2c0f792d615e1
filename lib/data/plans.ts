import { and, asc, desc, eq, inArray, isNull, ne, or, sql, type SQL } from "drizzle-orm";
import type { Tx } from "@/db";
import {
  observations,
  instruments,
  planPointings,
  plans,
  siteObservers,
  sites,
  users,
  type Footprint,
  type NewPlan,
  type NewPlanPointing,
  type Plan,
  type PlanPointing,
} from "@/db/schema";

/** Storage of pointing plans: queries only; the services decide what a missing row means. */

/** A footprint placed on the sky (what the planner leaves out under `avoid`). */
export interface PlacedTileRow {
  raDeg: number;
  decDeg: number;
  footprint: Footprint;
}

/** A site as planning needs it: position, limits, zone and the Moon distance to keep. */
export interface PlanSiteRow {
  id: string;
  code: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number;
  minAltitudeDeg: number;
  moonDistanceDeg: number;
  timeZone: string;
}

export interface StoredPlan {
  plan: Plan;
  site: { id: string; code: string; name: string; timeZone: string } | null;
  createdBy: { id: string; name: string } | null;
  pointings: Array<PlanPointing & { doneBy: { id: string; name: string } | null }>;
}

const INSERT_CHUNK = 100;

export async function readPlanSite(tx: Tx, siteId: string): Promise<PlanSiteRow | null> {
  const [row] = await tx
    .select({
      id: sites.id,
      code: sites.code,
      name: sites.name,
      latitudeDeg: sites.latitudeDeg,
      longitudeDeg: sites.longitudeDeg,
      elevationM: sites.elevationM,
      minAltitudeDeg: sites.minAltitudeDeg,
      moonDistanceDeg: sites.moonDistanceDeg,
      timeZone: sites.timeZone,
    })
    .from(sites)
    .where(eq(sites.id, siteId))
    .limit(1);
  return row ?? null;
}

export async function observesAtSite(tx: Tx, siteId: string, userId: string): Promise<boolean> {
  const [row] = await tx
    .select({ userId: siteObservers.userId })
    .from(siteObservers)
    .where(and(eq(siteObservers.siteId, siteId), eq(siteObservers.userId, userId)))
    .limit(1);
  return Boolean(row);
}

/** Every pointing of the candidate's open plans (not closed), except those of `exceptTaskId`: the sky other plans take. */
export async function openPlanTiles(tx: Tx, candidateId: string, exceptTaskId?: string): Promise<PlacedTileRow[]> {
  const where = [eq(plans.candidateId, candidateId), isNull(plans.closedAt)];
  if (exceptTaskId) where.push(or(isNull(plans.taskId), ne(plans.taskId, exceptTaskId)) as SQL);
  return tx
    .select({ raDeg: planPointings.raDeg, decDeg: planPointings.decDeg, footprint: plans.footprint })
    .from(planPointings)
    .innerJoin(plans, eq(plans.id, planPointings.planId))
    .where(and(...where))
    .orderBy(asc(plans.createdAt), asc(planPointings.planId), asc(planPointings.index));
}

/** Footprints already observed for the candidate (its whole log), which a new plan leaves out unless `avoid` is "none". */
export async function observedFootprints(tx: Tx, candidateId: string): Promise<PlacedTileRow[]> {
  return tx
    .select({ raDeg: observations.raDeg, decDeg: observations.decDeg, footprint: observations.footprint })
    .from(observations)
    .where(eq(observations.candidateId, candidateId))
    .orderBy(asc(observations.startTime), asc(observations.id));
}

/** Writes a plan and its pointings (call inside the service's transaction). */
export async function insertPlan(tx: Tx, plan: NewPlan, pointings: Array<Omit<NewPlanPointing, "planId">>): Promise<Plan> {
  const [row] = await tx.insert(plans).values(plan).returning();
  if (!row) throw new Error("plan insert returned nothing");
  for (let i = 0; i < pointings.length; i += INSERT_CHUNK) {
    await tx.insert(planPointings).values(pointings.slice(i, i + INSERT_CHUNK).map((p) => ({ ...p, planId: row.id })));
  }
  return row;
}

/** Plans with their site, author and pointings (by index, each with who ticked it), in the given plan order. */
async function readStoredPlans(tx: Tx, planRows: Array<{ plan: Plan; site: StoredPlan["site"] | null; createdBy: StoredPlan["createdBy"] }>): Promise<StoredPlan[]> {
  if (planRows.length === 0) return [];
  const ids = planRows.map((r) => r.plan.id);
  const rows = await tx
    .select({ pointing: planPointings, doneById: users.id, doneByName: users.name })
    .from(planPointings)
    .leftJoin(users, eq(users.id, planPointings.doneById))
    .where(inArray(planPointings.planId, ids))
    .orderBy(asc(planPointings.planId), asc(planPointings.index));
  const byPlan = new Map<string, StoredPlan["pointings"]>(ids.map((id) => [id, []]));
  for (const r of rows) {
    byPlan.get(r.pointing.planId)?.push({ ...r.pointing, doneBy: r.doneById ? { id: r.doneById, name: r.doneByName ?? "someone" } : null });
  }
  return planRows.map((r) => ({ plan: r.plan, site: r.site?.id ? r.site : null, createdBy: r.createdBy?.id ? r.createdBy : null, pointings: byPlan.get(r.plan.id) ?? [] }));
}

function selectPlans(tx: Tx) {
  return tx
    .select({
      plan: plans,
      site: { id: sites.id, code: sites.code, name: sites.name, timeZone: sites.timeZone },
      createdBy: { id: users.id, name: users.name },
    })
    .from(plans)
    .leftJoin(sites, eq(sites.id, plans.siteId))
    .leftJoin(users, eq(users.id, plans.createdById));
}

export async function readPlan(tx: Tx, planId: string): Promise<StoredPlan | null> {
  const rows = await selectPlans(tx).where(eq(plans.id, planId)).limit(1);
  return (await readStoredPlans(tx, rows))[0] ?? null;
}

/** A candidate's plans, newest first. */
export async function listCandidatePlans(tx: Tx, candidateId: string): Promise<StoredPlan[]> {
  return readStoredPlans(tx, await selectPlans(tx).where(eq(plans.candidateId, candidateId)).orderBy(desc(plans.createdAt), desc(plans.id)));
}

/** Plans attached to any of these tasks, newest first. */
export async function listTaskPlans(tx: Tx, taskIds: string[]): Promise<StoredPlan[]> {
  if (taskIds.length === 0) return [];
  return readStoredPlans(tx, await selectPlans(tx).where(inArray(plans.taskId, taskIds)).orderBy(desc(plans.createdAt), desc(plans.id)));
}

/** Closes the open plans of these tasks (a replaced plan, a cancelled task): they no longer hold sky for others. */
export async function closePlansOfTasks(tx: Tx, taskIds: string[], at: Date): Promise<void> {
  if (taskIds.length === 0) return;
  await tx.update(plans).set({ closedAt: at }).where(and(inArray(plans.taskId, taskIds), isNull(plans.closedAt)));
}

/** One pointing with its plan's candidate, task, site and open state, and whether `userId` observes at that site. */
export async function readPointingFor(tx: Tx, planId: string, pointingId: string, userId: string) {
  const [row] = await tx
    .select({
      pointing: planPointings,
      candidateId: plans.candidateId,
      taskId: plans.taskId,
      siteId: plans.siteId,
      closedAt: plans.closedAt,
      follows: siteObservers.userId,
    })
    .from(planPointings)
    .innerJoin(plans, eq(plans.id, planPointings.planId))
    .leftJoin(siteObservers, and(eq(siteObservers.siteId, plans.siteId), eq(siteObservers.userId, userId)))
    .where(and(eq(planPointings.id, pointingId), eq(planPointings.planId, planId)))
    .limit(1);
  if (!row) return null;
  return { pointing: row.pointing, candidateId: row.candidateId, taskId: row.taskId, siteId: row.siteId, closed: row.closedAt !== null, observesThere: row.follows !== null };
}

export async function setPointingDone(tx: Tx, pointingId: string, done: { at: Date; byId: string } | null): Promise<void> {
  await tx
    .update(planPointings)
    .set({ doneAt: done?.at ?? null, doneById: done?.byId ?? null })
    .where(eq(planPointings.id, pointingId));
}

/** What a task card shows of its newest open plan: pointings, how many have a time, how many are done. */
export interface TaskPlanSummary {
  planId: string;
  pointings: number;
  scheduled: number;
  done: number;
  scheduledProbability: number;
}

export async function taskPlanSummaries(tx: Tx, taskIds: string[]): Promise<Map<string, TaskPlanSummary>> {
  const out = new Map<string, TaskPlanSummary>();
  if (taskIds.length === 0) return out;
  const rows = await tx
    .select({
      taskId: plans.taskId,
      planId: plans.id,
      scheduledProbability: plans.scheduledProbability,
      pointings: sql<number>`count(${planPointings.id})`,
      scheduled: sql<number>`count(${planPointings.plannedStart})`,
      done: sql<number>`count(${planPointings.doneAt})`,
    })
    .from(plans)
    .leftJoin(planPointings, eq(planPointings.planId, plans.id))
    .where(and(inArray(plans.taskId, taskIds), isNull(plans.closedAt)))
    .groupBy(plans.id)
    .orderBy(desc(plans.createdAt));
  for (const r of rows) {
    if (!r.taskId || out.has(r.taskId)) continue;
    out.set(r.taskId, { planId: r.planId, pointings: Number(r.pointings), scheduled: Number(r.scheduled), done: Number(r.done), scheduledProbability: r.scheduledProbability });
  }
  return out;
}

/** Every instrument with its site's code, by site code then name: the planning form's choices. */
export async function listPlanInstruments(tx: Tx): Promise<Array<{ id: string; name: string; footprint: Footprint; siteId: string; siteCode: string }>> {
  return tx
    .select({ id: instruments.id, name: instruments.name, footprint: instruments.footprint, siteId: instruments.siteId, siteCode: sites.code })
    .from(instruments)
    .innerJoin(sites, eq(sites.id, instruments.siteId))
    .orderBy(asc(sites.code), asc(instruments.name));
}

/** The ids of the sites a person observes at. */
export async function observerSiteIds(tx: Tx, userId: string): Promise<string[]> {
  return (await tx.select({ siteId: siteObservers.siteId }).from(siteObservers).where(eq(siteObservers.userId, userId))).map((r) => r.siteId);
}
