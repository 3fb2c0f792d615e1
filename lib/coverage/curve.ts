import { placeFootprint, type Footprint } from "@/lib/skymap/footprint";
import { footprintPixels } from "@/lib/skymap/footprint-pixels";
import type { SkymapMap } from "@/lib/skymap/types";
import { CoverageMask } from "./union";

/** One logged exposure, as coverage needs it (the footprint already resolved from the instrument). */
export interface CoverageObservation {
  siteId: string | null;
  footprint: Footprint;
  raDeg: number;
  decDeg: number;
  startTime: Date;
  exposureS: number;
}

export interface CoveragePoint {
  /** End of the exposure (start + exposure): the moment its pixels count as observed. */
  time: Date;
  secondsSinceMerger: number;
  coveredProbability: number;
}

export interface SiteCoverage {
  siteId: string | null;
  coveredProbability: number;
  firstObservationAt: Date;
}

export interface Coverage {
  coveredProbability: number;
  coveredAreaDeg2: number;
  observations: number;
  curve: CoveragePoint[];
  bySite: SiteCoverage[];
}

export function endTime(o: CoverageObservation): Date {
  return new Date(o.startTime.getTime() + o.exposureS * 1000);
}

/**
 * Coverage of a sky map by an observation log: the union of every footprint (overlaps once), one curve point per
 * observation at its end time in time order (ties by start time, then log order), and each site's own union
 * with its first exposure's start. The curve never falls: each point is the union of everything ended by then.
 */
export function computeCoverage(map: SkymapMap, log: readonly CoverageObservation[], mergerTime: Date): Coverage {
  return new CoverageLog(map, mergerTime).add(log).result();
}

/**
 * A growing log's coverage. Exposures that end no earlier than the last one are added in place (only their own
 * pixels are touched); an exposure that ends earlier changes past curve points, so the whole log is replayed.
 */
export class CoverageLog {
  private log: CoverageObservation[] = [];
  private all: CoverageMask;
  private sites = new Map<string | null, { mask: CoverageMask; first: Date }>();
  private curve: CoveragePoint[] = [];

  constructor(
    private readonly map: SkymapMap,
    private readonly mergerTime: Date,
  ) {
    this.all = new CoverageMask(map);
  }

  add(observations: readonly CoverageObservation[]): this {
    const ordered = sortByEnd(observations);
    const lastEnd = this.curve.at(-1)?.time.getTime() ?? -Infinity;
    const first = ordered[0];
    this.log.push(...observations);
    if (first && endTime(first).getTime() < lastEnd) {
      this.all = new CoverageMask(this.map);
      this.sites.clear();
      this.curve = [];
      for (const o of sortByEnd(this.log)) this.apply(o);
    } else {
      for (const o of ordered) this.apply(o);
    }
    return this;
  }

  result(): Coverage {
    const bySite = [...this.sites.entries()]
      .map(([siteId, s]) => ({ siteId, coveredProbability: s.mask.coveredProbability, firstObservationAt: s.first }))
      .sort((a, b) => a.firstObservationAt.getTime() - b.firstObservationAt.getTime());
    const { coveredProbability, coveredAreaDeg2 } = this.all;
    return { coveredProbability, coveredAreaDeg2, observations: this.log.length, curve: [...this.curve], bySite };
  }

  private apply(o: CoverageObservation): void {
    const pixels = footprintPixels(this.map, placeFootprint(o.footprint, o.raDeg, o.decDeg));
    this.all.addPixels(pixels);
    let site = this.sites.get(o.siteId);
    if (!site) {
      site = { mask: new CoverageMask(this.map), first: o.startTime };
      this.sites.set(o.siteId, site);
    }
    if (o.startTime < site.first) site.first = o.startTime;
    site.mask.addPixels(pixels);
    const end = endTime(o).getTime();
    this.curve.push({ time: new Date(end), secondsSinceMerger: (end - this.mergerTime.getTime()) / 1000, coveredProbability: this.all.coveredProbability });
  }
}

/** Time order by end, ties by start, then log order (Array.prototype.sort is stable). */
function sortByEnd(log: readonly CoverageObservation[]): CoverageObservation[] {
  return [...log].sort((a, b) => endTime(a).getTime() - endTime(b).getTime() || a.startTime.getTime() - b.startTime.getTime());
}

/** First curve point reaching a covered fraction (e.g. 0.5, 0.9), or null when the log never reaches it. */
export function timeToReach(curve: readonly CoveragePoint[], fraction: number): CoveragePoint | null {
  return curve.find((p) => p.coveredProbability >= fraction) ?? null;
}
