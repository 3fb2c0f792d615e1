import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { placeFootprint, type Footprint } from "@/lib/skymap/footprint";
import { FootprintSearch } from "@/lib/skymap/footprint-search";
import { nest2ring, nestToRingCentre, pix2vec_nest } from "@/lib/skymap/healpix";
import { newIndexList } from "@/lib/skymap/index-list";
import { loadSkymap } from "@/lib/skymap/load";
import { fixtureBytes } from "./fixture-files";

// The same healpy reference as footprint.test.ts: query_polygon / query_disc with inclusive=False, per order on
// multi-order maps (tests/fixtures/scripts/footprint_make_fixtures.py, Debian's python3-healpy).
interface Reference {
  cases: Array<{ footprint: Footprint; raDeg: number; decDeg: number }>;
  maps: Record<string, { file: string; results: Array<{ pixels: number[]; probability: number }> }>;
}
const reference = JSON.parse(
  readFileSync(new URL("../fixtures/footprint/reference.json", import.meta.url), "utf8"),
) as Reference;

describe.each(Object.entries(reference.maps))("one search, many footprints, on %s", (_key, entry) => {
  const { map } = loadSkymap(fixtureBytes(entry.file));
  const mapOrder = map.layout === "multiorder" ? map.maxOrder : map.order;
  // bucket orders from one cell per base pixel to the map's own pixels (and beyond, which is capped)
  it.each([0, 2, mapOrder - 2, mapOrder - 1, mapOrder, mapOrder + 3])("bucket order %i: every case gives healpy's pixel set", (order) => {
    const search = new FootprintSearch(map, order);
    const out = newIndexList(8);
    for (const [i, c] of reference.cases.entries()) {
      out.length = 0;
      search.collect(placeFootprint(c.footprint, c.raDeg, c.decDeg), out);
      const pixels = Array.from(out.values.subarray(0, out.length)).sort((a, b) => a - b);
      expect(pixels, `case ${i}`).toEqual(entry.results[i]?.pixels);
    }
  });
});

describe("nestToRingCentre", () => {
  it.each([1, 2, 4, 16, 64])("nside %i: RING index as @hscmap/healpix's nest2ring, centre as its pix2vec_nest", (nside) => {
    const out = new Float64Array(3);
    let worst = 0;
    for (let pix = 0; pix < 12 * nside * nside; pix++) {
      nestToRingCentre(nside, pix, out);
      expect(out[0]).toBe(nest2ring(nside, pix));
      const z = out[1] ?? 0;
      const phi = out[2] ?? 0;
      const s = Math.sqrt((1 - z) * (1 + z));
      const [x, y, zz] = pix2vec_nest(nside, pix);
      worst = Math.max(worst, Math.abs(s * Math.cos(phi) - x), Math.abs(s * Math.sin(phi) - y), Math.abs(z - zz));
    }
    expect(worst).toBeLessThan(1e-14);
  });
});
