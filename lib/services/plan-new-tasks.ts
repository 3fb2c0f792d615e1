import { getDb } from "@/db";
import type { FollowUpTask } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { instrumentsOfSite } from "@/lib/data/instruments";
import { listCandidateSkymaps } from "@/lib/data/skymaps";
import type { PlanRecord } from "@/lib/plans/record";
import { footprintAreaDeg2 } from "@/lib/validations/instruments";
import { defaultPlanLevel, maxPlanPointings } from "@/lib/validations/plans";
import { planFollowUp } from "./plan-follow-up";

/**
 * Planning a follow-up task for a site attaches a pointing plan: for each new task with a site, a plan with the
 * site's first instrument (by name) and the defaults (level 0.9, the task's window, other plans' sky avoided; no
 * more pointings than fit in the window), one after another so each avoids the ones before. Runs after the tasks are committed; a candidate without a sky map,
 * or a site without instruments, gets no plan (the task view offers one later), so task creation never fails here.
 */
export async function planNewTasks(actor: SessionUser, tasks: readonly FollowUpTask[], now: Date): Promise<PlanRecord[]> {
  const withSite = tasks.filter((t) => t.siteId);
  if (withSite.length === 0) return [];
  const db = await getDb();
  const plans: PlanRecord[] = [];
  const area90 = new Map<string, number | null>();
  for (const task of withSite) {
    if (!area90.has(task.candidateId)) area90.set(task.candidateId, (await listCandidateSkymaps(task.candidateId))[0]?.area90Deg2 ?? null);
    const regionDeg2 = area90.get(task.candidateId);
    const [instrument] = await instrumentsOfSite(db, task.siteId ?? "");
    if (!instrument || regionDeg2 == null) continue;
    // an instrument that would need more than the most pointings to tile the region (a spectrograph) is planned by hand
    if (regionDeg2 / footprintAreaDeg2(instrument.footprint) > maxPlanPointings) continue;
    // no more pointings than the window can hold (a day when the task has none)
    const windowS = task.windowStart && task.windowEnd ? (task.windowEnd.getTime() - task.windowStart.getTime()) / 1000 : 86_400;
    const maxPointings = Math.max(1, Math.min(maxPlanPointings, Math.floor(windowS / (instrument.exposureS + instrument.overheadS))));
    try {
      plans.push(await planFollowUp(actor, task.candidateId, { instrumentId: instrument.id, level: defaultPlanLevel, maxPointings, avoid: "planned-and-observed", taskId: task.id }, now));
    } catch (error) {
      // a window the planner refuses (e.g. over 48 h) leaves the task without a plan; anything else is a fault
      if (!(error instanceof ApiError) || error.status >= 500) throw error;
    }
  }
  return plans;
}
