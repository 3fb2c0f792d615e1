import { getDb } from "@/db";
import type { Observation } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { listCandidateObservations } from "@/lib/data/observations";
import { listCandidateSkymaps, readSkymapMap } from "@/lib/data/skymaps";
import { readCandidateRow } from "@/lib/data/triggers";
import { CoverageLogCache, type Coverage, type CoverageObservation } from "@/lib/coverage";

/** GET /api/v1/candidates/{id}/coverage, exactly the shape (times as ISO 8601 UTC). */
export interface CoverageAnswer {
  skymapId: string;
  coveredProbability: number;
  coveredAreaDeg2: number;
  observations: number;
  curve: Array<{ time: string; secondsSinceMerger: number; coveredProbability: number }>;
  bySite: Array<{ siteId: string | null; coveredProbability: number; firstObservationAt: string }>;
}

// Per process, shared by every request (and the review), so a growing log is extended rather than recomputed.
const globalLogs = globalThis as unknown as { chirpdeskCoverageLogs?: CoverageLogCache };
export const coverageLogs = (globalLogs.chirpdeskCoverageLogs ??= new CoverageLogCache());

export function toCoverageObservation(o: Observation): CoverageObservation & { id: string } {
  return { id: o.id, siteId: o.siteId, footprint: o.footprint, raDeg: o.raDeg, decDeg: o.decDeg, startTime: o.startTime, exposureS: o.exposureS };
}

/**
 * A candidate's coverage on its newest sky map (so a new revision's map recomputes it): the union of every logged
 * footprint, the curve and the per-site unions. 404 for an unknown candidate, 409 when it has no sky map yet.
 */
export async function readCandidateCoverage(candidateId: string): Promise<CoverageAnswer> {
  const db = await getDb();
  const candidate = await readCandidateRow(db, candidateId);
  if (!candidate) throw new ApiError(404, "candidate not found");
  const [skymap] = await listCandidateSkymaps(candidateId);
  if (!skymap) throw new ApiError(409, "this candidate has no sky map yet, so there is nothing to cover");
  const rows = await listCandidateObservations(candidateId);
  const coverage = coverageLogs.coverage(skymap.id, () => readSkymapMap(skymap.file.sha256), candidate.eventTime, rows.map(toCoverageObservation));
  return toAnswer(skymap.id, coverage);
}

function toAnswer(skymapId: string, c: Coverage): CoverageAnswer {
  return {
    skymapId,
    coveredProbability: c.coveredProbability,
    coveredAreaDeg2: c.coveredAreaDeg2,
    observations: c.observations,
    curve: c.curve.map((p) => ({ time: p.time.toISOString(), secondsSinceMerger: p.secondsSinceMerger, coveredProbability: p.coveredProbability })),
    bySite: c.bySite.map((s) => ({ siteId: s.siteId, coveredProbability: s.coveredProbability, firstObservationAt: s.firstObservationAt.toISOString() })),
  };
}
