import { getDb } from "@/db";
import type { Observation } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { listCandidateObservations } from "@/lib/data/observations";
import { listCandidateSkymaps, readSkymapMap } from "@/lib/data/skymaps";
import { readCandidateRow } from "@/lib/data/triggers";
import { CoverageLog, type Coverage, type CoverageObservation } from "@/lib/coverage";

/** GET /api/v1/candidates/{id}/coverage, exactly the shape (times as ISO 8601 UTC). */
export interface CoverageAnswer {
  skymapId: string;
  coveredProbability: number;
  coveredAreaDeg2: number;
  observations: number;
  curve: Array<{ time: string; secondsSinceMerger: number; coveredProbability: number }>;
  bySite: Array<{ siteId: string | null; coveredProbability: number; firstObservationAt: string }>;
}

interface CachedLog {
  log: CoverageLog;
  mergerMs: number;
  seen: Set<string>;
}

// One growing log per sky map, per process: a request adds only the rows it has not seen (lib/coverage adds them
// in place unless they end before the last), so a busy night's log is not re-unioned on every board refresh.
const globalLogs = globalThis as unknown as { chirpdeskCoverageLogs?: Map<string, CachedLog> };
const logs = (globalLogs.chirpdeskCoverageLogs ??= new Map<string, CachedLog>());
const MAX_CACHED_LOGS = 32;

export function toCoverageObservation(o: Observation): CoverageObservation {
  return { siteId: o.siteId, footprint: o.footprint, raDeg: o.raDeg, decDeg: o.decDeg, startTime: o.startTime, exposureS: o.exposureS };
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
  const coverage = coverageOn(skymap.id, () => readSkymapMap(skymap.file.sha256), candidate.eventTime, rows);
  return toAnswer(skymap.id, coverage);
}

/** The cached log of this map brought up to `rows`; rebuilt when a row it holds is gone or the merger time moved. */
function coverageOn(skymapId: string, loadMap: () => ReturnType<typeof readSkymapMap>, mergerTime: Date, rows: Observation[]): Coverage {
  let cached = logs.get(skymapId);
  const ids = new Set(rows.map((r) => r.id));
  const stale = cached && (cached.mergerMs !== mergerTime.getTime() || [...cached.seen].some((id) => !ids.has(id)));
  if (!cached || stale) {
    cached = { log: new CoverageLog(loadMap(), mergerTime), mergerMs: mergerTime.getTime(), seen: new Set() };
    logs.delete(skymapId);
    logs.set(skymapId, cached);
    for (const key of logs.keys()) {
      if (logs.size <= MAX_CACHED_LOGS) break;
      logs.delete(key);
    }
  }
  const fresh = rows.filter((r) => !cached.seen.has(r.id));
  if (fresh.length) {
    cached.log.add(fresh.map(toCoverageObservation));
    for (const r of fresh) cached.seen.add(r.id);
  }
  return cached.log.result();
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
