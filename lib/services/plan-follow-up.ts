import { getDb } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { comingNight } from "@/lib/astro";
import { DEFAULT_MOON_DISTANCE_DEG } from "@/lib/astro/schedule";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { findInstrument } from "@/lib/data/instruments";
import { readTask } from "@/lib/data/tasks";
import { closePlansOfTasks, insertPlan, observedFootprints, observesAtSite, openPlanTiles, readPlan, readPlanSite, type PlanSiteRow } from "@/lib/data/plans";
import { listCandidateSkymaps, readSkymapMap } from "@/lib/data/skymaps";
import { readCandidateRow } from "@/lib/data/triggers";
import { eventKinds } from "@/lib/events/kinds";
import { greedyPlan, unionProbability } from "@/lib/planning/greedy";
import { schedulePointings, type ScheduleSite } from "@/lib/planning/schedule";
import { toPlanRecord, type PlanRecord } from "@/lib/plans/record";
import { windowIssue, type PlanRequest } from "@/lib/validations/plans";

const HOUR_MS = 3_600_000;

function fieldError(path: string, message: string): ApiError {
  return new ApiError(422, `invalid request body: ${path}: ${message}`, { issues: [{ path, message }] });
}

function scheduleSite(site: PlanSiteRow): ScheduleSite {
  return { latDeg: site.latitudeDeg, lonDeg: site.longitudeDeg, elevationM: site.elevationM, minAltitudeDeg: site.minAltitudeDeg, moonDistanceDeg: site.moonDistanceDeg };
}

/**
 * The window: from `start` (default now) to `end` (default: the end of the site's coming astronomical night after
 * the start; a full day when the Sun does not get 18° down within a day, so the schedule says why nothing fits).
 */
function planWindow(site: ScheduleSite, input: Pick<PlanRequest, "start" | "end">, task: FollowUpTask | null, now: Date): { start: Date; end: Date } {
  const start = input.start ?? task?.windowStart ?? now;
  const end = input.end ?? task?.windowEnd ?? comingNight(site, start)?.end ?? new Date(start.getTime() + 24 * HOUR_MS);
  const issue = windowIssue(start, end);
  if (issue) throw fieldError("end", input.end ? issue : `${issue} (the window starts ${start.toISOString()})`);
  return { start, end };
}

/**
 * Plans pointings for one instrument over a candidate's newest sky map. Checks (404 candidate or instrument, 403
 * an observer planning another site's instrument, 409 no sky map, 422 filter or window) and the reads come first;
 * the planner and the scheduler run outside any write transaction (they take seconds on big maps); then the plan,
 * its pointings and the audit event are written in one transaction. With `taskId` the plan belongs to that task
 * (404 unknown, 422 another candidate's or another site's, 409 finished): the task's window is the default one, the
 * task's earlier plans are closed and their sky is not avoided (the new plan replaces them).
 */
export async function planFollowUp(actor: SessionUser, candidateId: string, input: PlanRequest, now: Date): Promise<PlanRecord> {
  const db = await getDb();
  if (!(await readCandidateRow(db, candidateId))) throw new ApiError(404, "candidate not found");
  const instrument = await findInstrument(db, input.instrumentId);
  if (!instrument) throw new ApiError(404, "instrument not found");
  if (actor.role === "observer" && !(await observesAtSite(db, instrument.siteId, actor.id))) {
    throw new ApiError(403, "observers plan only for the instruments of the sites they observe at");
  }
  const task = input.taskId ? await readTask(db, input.taskId) : null;
  const taskId = task?.id ?? null;
  if (input.taskId && !task) throw new ApiError(404, "task not found");
  if (task && task.candidateId !== candidateId) throw fieldError("taskId", "the task belongs to another candidate");
  if (task?.siteId && task.siteId !== instrument.siteId) throw fieldError("instrumentId", "choose an instrument of the task's site");
  if (task && (task.state === "cancelled" || task.state === "reported")) throw new ApiError(409, `the task is ${task.state}; plan for an unfinished task`);
  const siteRow = await readPlanSite(db, instrument.siteId);
  if (!siteRow) throw new ApiError(404, "the instrument's site not found");
  const [skymap] = await listCandidateSkymaps(candidateId);
  if (!skymap) throw new ApiError(409, "this candidate has no sky map yet; upload one before planning pointings");
  if (input.filter !== undefined && instrument.filters.length > 0 && !instrument.filters.includes(input.filter)) {
    throw fieldError("filter", `${instrument.name} has the filters ${instrument.filters.join(", ")}`);
  }
  const site = scheduleSite(siteRow);
  const window = planWindow(site, input, task, now);
  const avoid = [
    ...(input.avoid === "planned-and-observed" ? await openPlanTiles(db, candidateId, taskId ?? undefined) : []),
    ...(input.avoid === "none" ? [] : await observedFootprints(db, candidateId)),
  ];

  const map = readSkymapMap(skymap.file.sha256);
  const exposureS = input.exposureS ?? instrument.exposureS;
  const greedy = greedyPlan(map, instrument.footprint, { level: input.level, maxPointings: input.maxPointings, avoid });
  const times = schedulePointings(greedy.pointings, { site, window, exposureS, overheadS: instrument.overheadS });
  const scheduledProbability = unionProbability(map.probability, greedy.pointings.filter((_, i) => times[i]?.plannedStart));

  return db.transaction(async (tx) => {
    if (taskId) await closePlansOfTasks(tx, [taskId], now);
    const plan = await insertPlan(
      tx,
      {
        candidateId,
        skymapId: skymap.id,
        instrumentId: instrument.id,
        siteId: siteRow.id,
        taskId,
        instrumentName: instrument.name,
        footprint: instrument.footprint,
        exposureS,
        overheadS: instrument.overheadS,
        filter: input.filter ?? instrument.filters[0] ?? null,
        level: input.level,
        maxPointings: input.maxPointings,
        avoid: input.avoid,
        moonDistanceDeg: site.moonDistanceDeg ?? DEFAULT_MOON_DISTANCE_DEG,
        windowStart: window.start,
        windowEnd: window.end,
        totalProbability: greedy.totalProbability,
        scheduledProbability,
        avoidedProbability: greedy.avoidedProbability,
        createdById: actor.id,
        createdAt: now,
      },
      greedy.pointings.map((p, i) => {
        const t = times[i];
        return {
          index: i + 1,
          raDeg: p.raDeg,
          decDeg: p.decDeg,
          probability: p.probability,
          gainedProbability: p.gainedProbability,
          cumulativeProbability: p.cumulativeProbability,
          plannedStart: t?.plannedStart ?? null,
          plannedEnd: t?.plannedEnd ?? null,
          altitudeDeg: t?.altitudeDeg ?? null,
          airmass: t?.airmass ?? null,
          moonSeparationDeg: t?.moonSeparationDeg ?? null,
          unscheduledReason: t ? t.unscheduledReason : "not-observable-in-window",
        };
      }),
    );
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.planCreated,
      actorId: actor.id,
      candidateId,
      taskId,
      data: {
        planId: plan.id,
        siteId: siteRow.id,
        instrumentId: instrument.id,
        taskId,
        pointings: greedy.pointings.length,
        scheduled: times.filter((t) => t.plannedStart).length,
        scheduledProbability,
      },
    });
    const stored = await readPlan(tx, plan.id);
    if (!stored) throw new Error("plan vanished inside its own transaction");
    return toPlanRecord(stored);
  });
}
