import type { Footprint, PlanAvoidMode } from "@/db/schema";
import type { StoredPlan } from "@/lib/data/plans";

/** One pointing as the API answers it (times ISO 8601 UTC; null with a reason when it could not be scheduled). */
export interface PointingRecord {
  id: string;
  index: number;
  raDeg: number;
  decDeg: number;
  probability: number;
  gainedProbability: number;
  cumulativeProbability: number;
  plannedStart: string | null;
  plannedEnd: string | null;
  altitudeDeg: number | null;
  airmass: number | null;
  moonSeparationDeg: number | null;
  unscheduledReason: string | null;
  doneAt: string | null;
  doneBy: { id: string; name: string } | null;
}

/** A plan as GET /api/v1/plans/{id} answers it: the fields first, then what the screens and export use. */
export interface PlanRecord {
  id: string;
  candidateId: string;
  instrumentId: string | null;
  skymapId: string;
  level: number;
  footprint: Footprint;
  window: { start: string; end: string };
  pointings: PointingRecord[];
  totalProbability: number;
  scheduledProbability: number;
  site: { id: string; code: string; name: string; timeZone: string } | null;
  taskId: string | null;
  instrumentName: string;
  exposureS: number;
  overheadS: number;
  filter: string | null;
  maxPointings: number;
  avoid: PlanAvoidMode;
  avoidedProbability: number;
  moonDistanceDeg: number;
  createdAt: string;
  createdBy: { id: string; name: string } | null;
  closedAt: string | null;
}

const iso = (d: Date | null) => (d ? d.toISOString() : null);

export function toPlanRecord({ plan, site, createdBy, pointings }: StoredPlan): PlanRecord {
  return {
    id: plan.id,
    candidateId: plan.candidateId,
    instrumentId: plan.instrumentId,
    skymapId: plan.skymapId,
    level: plan.level,
    footprint: plan.footprint,
    window: { start: plan.windowStart.toISOString(), end: plan.windowEnd.toISOString() },
    pointings: pointings.map((p) => ({
      id: p.id,
      index: p.index,
      raDeg: p.raDeg,
      decDeg: p.decDeg,
      probability: p.probability,
      gainedProbability: p.gainedProbability,
      cumulativeProbability: p.cumulativeProbability,
      plannedStart: iso(p.plannedStart),
      plannedEnd: iso(p.plannedEnd),
      altitudeDeg: p.altitudeDeg,
      airmass: p.airmass,
      moonSeparationDeg: p.moonSeparationDeg,
      unscheduledReason: p.unscheduledReason,
      doneAt: iso(p.doneAt),
      doneBy: p.doneBy,
    })),
    totalProbability: plan.totalProbability,
    scheduledProbability: plan.scheduledProbability,
    site,
    taskId: plan.taskId,
    instrumentName: plan.instrumentName,
    exposureS: plan.exposureS,
    overheadS: plan.overheadS,
    filter: plan.filter,
    maxPointings: plan.maxPointings,
    avoid: plan.avoid,
    avoidedProbability: plan.avoidedProbability,
    moonDistanceDeg: plan.moonDistanceDeg,
    createdAt: plan.createdAt.toISOString(),
    createdBy,
    closedAt: iso(plan.closedAt),
  };
}
