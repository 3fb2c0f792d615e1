import type { Tx } from "@/db";
import { computeCoverage, timeToReach, type CoveragePoint } from "@/lib/coverage";
import { listObservationsOf, newestSkymapFilesOf } from "@/lib/data/observations";
import { readSkymapMap } from "@/lib/data/skymaps";
import type { CandidateFacts } from "./timeline";

/** One candidate's coverage curve on its newest map, for the review's overlaid chart. */
export interface ReviewCurve {
  candidateId: string;
  externalId: string;
  points: Array<{ secondsSinceMerger: number; coveredProbability: number }>;
}

/**
 * Fills the observing milestones of the facts from the observation log: the first exposure (its start, who logged
 * it) and the ends of the exposures that took the newest sky map's observed probability to 50 % and 90 % (the
 * curve of lib/coverage, overlaps counted once). Answers the curves of the candidates that have any.
 */
export async function attachCoverageFacts(facts: CandidateFacts[], q?: Tx): Promise<ReviewCurve[]> {
  if (facts.length === 0) return [];
  const ids = facts.map((f) => f.id);
  const [logs, maps] = await Promise.all([listObservationsOf(ids, q), newestSkymapFilesOf(ids, q)]);
  const byCandidate = new Map<string, typeof logs>();
  for (const o of logs) {
    const list = byCandidate.get(o.candidateId);
    if (list) list.push(o);
    else byCandidate.set(o.candidateId, [o]);
  }
  const curves: ReviewCurve[] = [];
  for (const f of facts) {
    const file = maps.get(f.id);
    f.hasSkymap = file !== undefined;
    const log = byCandidate.get(f.id);
    const first = log?.[0];
    if (!log || !first) continue;
    f.firstExposureAtMs = first.startTime.getTime();
    f.firstExposureById = first.recordedById;
    if (!file) continue;
    const coverage = computeCoverage(readSkymapMap(file.sha256), log, new Date(f.eventTimeMs));
    const at = (p: CoveragePoint | null) => p?.time.getTime() ?? null;
    f.covered50AtMs = at(timeToReach(coverage.curve, 0.5));
    f.covered90AtMs = at(timeToReach(coverage.curve, 0.9));
    curves.push({
      candidateId: f.id,
      externalId: f.externalId,
      points: coverage.curve.map((p) => ({ secondsSinceMerger: p.secondsSinceMerger, coveredProbability: p.coveredProbability })),
    });
  }
  return curves;
}
