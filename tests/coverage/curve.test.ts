import { describe, expect, it } from "vitest";
import { computeCoverage, CoverageLog, timeToReach, type CoverageObservation } from "@/lib/coverage/curve";
import type { FlatSkymap } from "@/lib/skymap/types";
import { footprintPixels } from "@/lib/skymap/footprint-pixels";
import { placeFootprint } from "@/lib/skymap/footprint";

// A hand-made sky: nside 16 flat NESTED map with all probability in a few pixels we can name, so the expected
// curve is written out by hand from which pixels each exposure covers.
const NSIDE = 16;
const fields = [
  { raDeg: 45, decDeg: 20 },
  { raDeg: 100, decDeg: -30 },
  { raDeg: 200, decDeg: 50 },
];

function handMap(): { map: FlatSkymap; weights: number[] } {
  const probability = new Float64Array(12 * NSIDE * NSIDE);
  const shell: FlatSkymap = { layout: "flat-nested", nside: NSIDE, order: 4, probability };
  // 0.5, 0.3 and 0.2 in one pixel near each field centre (inside the 3° circle each exposure uses there)
  const weights = [0.5, 0.3, 0.2];
  fields.forEach((f, k) => {
    const pix = footprintPixels(shell, placeFootprint({ shape: "circle", radiusDeg: 3 }, f.raDeg, f.decDeg));
    const nearest = pix[0];
    if (nearest === undefined) throw new Error("no pixel near field");
    probability[nearest] = weights[k] ?? 0;
  });
  return { map: shell, weights };
}

const merger = new Date("2026-12-01T00:00:00Z");
const at = (minutes: number) => new Date(merger.getTime() + minutes * 60_000);
const obs = (field: number, startMin: number, exposureS: number, siteId: string | null): CoverageObservation => {
  const f = fields[field];
  if (!f) throw new Error("no field");
  return { siteId, footprint: { shape: "circle", radiusDeg: 3 }, raDeg: f.raDeg, decDeg: f.decDeg, startTime: at(startMin), exposureS };
};

describe("computeCoverage against a hand-made log", () => {
  const { map } = handMap();
  // logged out of time order on purpose; site B re-images field 0 after site A
  const log = [obs(2, 90, 300, "B"), obs(0, 10, 120, "A"), obs(0, 60, 60, "B"), obs(1, 30, 600, "A")];
  const coverage = computeCoverage(map, log, merger);

  it("puts one point per observation at its end time, in time order, rising", () => {
    expect(coverage.curve.map((p) => p.time.toISOString())).toEqual([
      at(12).toISOString(), // field 0, 10 min + 120 s
      at(40).toISOString(), // field 1, 30 min + 600 s
      at(61).toISOString(), // field 0 again
      at(95).toISOString(), // field 2
    ]);
    expect(coverage.curve.map((p) => p.secondsSinceMerger)).toEqual([720, 2400, 3660, 5700]);
    const probs = coverage.curve.map((p) => p.coveredProbability);
    expect(probs[0]).toBeCloseTo(0.5, 12);
    expect(probs[1]).toBeCloseTo(0.8, 12);
    expect(probs[2]).toBeCloseTo(0.8, 12); // the re-image adds nothing
    expect(probs[3]).toBeCloseTo(1.0, 12);
  });

  it("reports the union, the count and each site's own union with its first start", () => {
    expect(coverage.coveredProbability).toBeCloseTo(1, 12);
    expect(coverage.observations).toBe(4);
    expect(coverage.bySite.map((s) => s.siteId)).toEqual(["A", "B"]);
    expect(coverage.bySite[0]?.coveredProbability).toBeCloseTo(0.8, 12);
    expect(coverage.bySite[0]?.firstObservationAt.toISOString()).toBe(at(10).toISOString());
    expect(coverage.bySite[1]?.coveredProbability).toBeCloseTo(0.7, 12);
    expect(coverage.bySite[1]?.firstObservationAt.toISOString()).toBe(at(60).toISOString());
  });

  it("finds the first point reaching a fraction, or none", () => {
    expect(timeToReach(coverage.curve, 0.5)?.secondsSinceMerger).toBe(720);
    expect(timeToReach(coverage.curve, 0.9)?.secondsSinceMerger).toBe(5700);
    expect(timeToReach(computeCoverage(map, log.slice(1, 2), merger).curve, 0.9)).toBeNull();
  });

  it("answers an empty log with nothing covered", () => {
    const empty = computeCoverage(map, [], merger);
    expect(empty).toEqual({ coveredProbability: 0, coveredAreaDeg2: 0, observations: 0, curve: [], bySite: [] });
  });

  it("counts covered area once per pixel", () => {
    const pixelDeg2 = 41252.96124941927 / (12 * NSIDE * NSIDE); // 4π sr in deg² over the pixel count
    const covered = new Set(log.flatMap((o) => footprintPixels(map, placeFootprint(o.footprint, o.raDeg, o.decDeg))));
    expect(coverage.coveredAreaDeg2).toBeCloseTo(covered.size * pixelDeg2, 8);
  });
});

describe("CoverageLog grows a log", () => {
  const { map } = handMap();
  const log = [obs(0, 10, 120, "A"), obs(1, 30, 600, "A"), obs(0, 60, 60, "B"), obs(2, 90, 300, "B")];

  it("appending later exposures gives the same answer as computing the whole log", () => {
    const grown = new CoverageLog(map, merger).add(log.slice(0, 2)).add(log.slice(2)).result();
    expect(grown).toEqual(computeCoverage(map, log, merger));
  });

  it("an exposure that ended earlier than the last point is put in its place on the curve", () => {
    const late = new CoverageLog(map, merger).add([log[0]!, log[3]!]).add([log[1]!]).result();
    expect(late.curve.map((p) => p.secondsSinceMerger)).toEqual([720, 2400, 5700]);
    expect(late.curve.map((p) => Number(p.coveredProbability.toFixed(12)))).toEqual([0.5, 0.8, 1]);
    expect(late).toEqual(computeCoverage(map, [log[0]!, log[1]!, log[3]!], merger));
  });
});
