import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { footprintOutline, placeFootprint, type Footprint } from "@/lib/skymap/footprint";
import { footprintPixels, footprintProbability } from "@/lib/skymap/footprint-pixels";
import { raDecToVec } from "@/lib/skymap/healpix";
import { loadSkymap } from "@/lib/skymap/load";
import { fixtureBytes, separationDeg } from "./fixture-files";

// Reference: healpy query_polygon / query_disc with inclusive=False (pixel centres inside), run per order on
// multi-order maps, by tests/fixtures/scripts/footprint_make_fixtures.py on Debian's python3-healpy.
interface Reference {
  cases: Array<{ footprint: Footprint; raDeg: number; decDeg: number }>;
  maps: Record<string, { file: string; results: Array<{ pixels: number[]; probability: number }> }>;
}
const reference = JSON.parse(
  readFileSync(new URL("../fixtures/footprint/reference.json", import.meta.url), "utf8"),
) as Reference;

describe.each(Object.entries(reference.maps))("footprint pixels on %s", (_key, entry) => {
  const { map } = loadSkymap(fixtureBytes(entry.file));
  it.each(reference.cases.map((c, i) => [i, c] as const))("case %i: same pixel set and probability as healpy", (i, c) => {
    const expected = entry.results[i];
    if (!expected) throw new Error(`no reference for case ${i}`);
    const pixels = footprintPixels(map, placeFootprint(c.footprint, c.raDeg, c.decDeg)).sort((a, b) => a - b);
    expect(pixels).toEqual(expected.pixels);
    expect(footprintProbability(map, c.footprint, c.raDeg, c.decDeg)).toBeCloseTo(expected.probability, 12);
  });
});

describe("placeFootprint", () => {
  const rect: Footprint = { shape: "rectangle", widthDeg: 4, heightDeg: 2 };

  it("puts a rectangle's corners at the gnomonic de-projection, north up", () => {
    const [ne, nw, sw, se] = footprintOutline(rect, 10, 0);
    // On the equator: tan(ξ-offset) = tan(2°) east, and dec = atan(tan 1° · cos(ra offset)) (gnomonic, Snyder 1987 §22)
    expect(ne?.raDeg).toBeCloseTo(12, 10);
    expect(ne?.decDeg).toBeCloseTo((Math.atan(Math.tan(Math.PI / 180) * Math.cos((2 * Math.PI) / 180)) * 180) / Math.PI, 10);
    expect(nw?.raDeg).toBeCloseTo(8, 10);
    expect(sw?.decDeg).toBeLessThan(0);
    expect(se?.raDeg).toBeCloseTo(12, 10);
  });

  it("contains its corners (edges included) and not points just beyond the edges", () => {
    const placed = placeFootprint(rect, 200, 40);
    for (const corner of footprintOutline(rect, 200, 40)) {
      const [x, y, z] = raDecToVec(corner.raDeg, corner.decDeg);
      const shrink = 1 - 1e-9; // the corner itself sits on the boundary: pull it a hair towards the centre
      const [cx, cy, cz] = placed.centre;
      expect(placed.contains(cx + (x - cx) * shrink, cy + (y - cy) * shrink, cz + (z - cz) * shrink)).toBe(true);
      expect(placed.contains(cx + (x - cx) * 1.001, cy + (y - cy) * 1.001, cz + (z - cz) * 1.001)).toBe(false);
      expect(separationDeg({ raDeg: 200, decDeg: 40 }, corner)).toBeLessThanOrEqual((placed.boundRadiusRad * 180) / Math.PI + 1e-9);
    }
  });

  it("never contains the antipode of a rectangle's centre", () => {
    const placed = placeFootprint({ shape: "rectangle", widthDeg: 89, heightDeg: 89 }, 30, 10);
    const [x, y, z] = raDecToVec(210, -10);
    expect(placed.contains(x, y, z)).toBe(false);
  });
});
