import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CoverageMask } from "@/lib/coverage/union";
import { searchedRegion } from "@/lib/coverage/searched";
import type { Footprint } from "@/lib/skymap/footprint";
import { loadSkymap } from "@/lib/skymap/load";
import { fixtureBytes } from "../skymap/fixture-files";

// Reference: healpy query_polygon / query_disc (inclusive=False) unions and ang2pix searched regions, written by
// tests/fixtures/scripts/coverage_make_fixtures.py on Debian's python3-healpy.
interface Reference {
  logs: Array<Array<{ footprint: Footprint; raDeg: number; decDeg: number }>>;
  positions: Array<{ raDeg: number; decDeg: number }>;
  maps: Record<
    string,
    {
      file: string;
      unions: Array<{ pixelCount: number; coveredProbability: number; coveredAreaDeg2: number }>;
      searched: Array<{ searchedProbability: number; searchedAreaDeg2: number; probabilityDensityPerDeg2: number }>;
    }
  >;
}
const reference = JSON.parse(readFileSync(new URL("../fixtures/coverage/reference.json", import.meta.url), "utf8")) as Reference;

describe.each(Object.entries(reference.maps))("coverage on %s against healpy", (_key, entry) => {
  const { map } = loadSkymap(fixtureBytes(entry.file));

  it.each(reference.logs.map((log, i) => [i, log] as const))("log %i: union pixels, probability and area", (i, log) => {
    const expected = entry.unions[i];
    if (!expected) throw new Error(`no reference for log ${i}`);
    const mask = new CoverageMask(map);
    for (const o of log) mask.add(o.footprint, o.raDeg, o.decDeg);
    expect(mask.covered.reduce((n, v) => n + v, 0)).toBe(expected.pixelCount);
    expect(mask.coveredProbability).toBeCloseTo(expected.coveredProbability, 12);
    expect(mask.coveredAreaDeg2).toBeCloseTo(expected.coveredAreaDeg2, 8);
  });

  it.each(reference.positions.map((p, i) => [i, p] as const))("position %i: searched probability, area and density", (i, p) => {
    const expected = entry.searched[i];
    if (!expected) throw new Error(`no reference for position ${i}`);
    const got = searchedRegion(map, p.raDeg, p.decDeg);
    expect(got.searchedProbability).toBeCloseTo(expected.searchedProbability, 10);
    expect(got.searchedAreaDeg2).toBeCloseTo(expected.searchedAreaDeg2, 6);
    expect(got.probabilityDensityPerDeg2 / (expected.probabilityDensityPerDeg2 || 1)).toBeCloseTo(expected.probabilityDensityPerDeg2 ? 1 : 0, 10);
  });
});

describe("the union counts an overlap once", () => {
  const { map } = loadSkymap(fixtureBytes("bimodal-ring-n128.fits.gz"));
  it("re-imaging the same field adds nothing", () => {
    const mask = new CoverageMask(map);
    const fp: Footprint = { shape: "rectangle", widthDeg: 3, heightDeg: 3 };
    const first = mask.add(fp, 123.4, -35);
    expect(first).toBeGreaterThan(0);
    expect(mask.add(fp, 123.4, -35)).toBe(0);
    expect(mask.coveredProbability).toBe(first);
  });
});
