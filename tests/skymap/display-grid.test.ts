import { describe, expect, it } from "vitest";
import {
  analyseSkymap,
  coneProbability,
  credibleRegionPoints,
  decodeDisplayGrid,
  degradeDisplayGrid,
  displayGridToMap,
  encodeDisplayGrid,
  SkymapCache,
  type SkymapMap,
  toDisplayGrid,
} from "@/lib/skymap";
import { credibleArea } from "@/lib/skymap/credible";
import { pixelAreaSr, SR_TO_DEG2 } from "@/lib/skymap/healpix";
import { fixtureBytes, reference, relativeDifference, separationDeg } from "./fixture-files";

function load(name: string): SkymapMap {
  const result = analyseSkymap(fixtureBytes(name));
  if (!result.ok) throw new Error(result.error.message);
  return result.map;
}

// Reference: healpy.ud_grade(power=-2) for flat maps and a numpy raster for the multi-order one
describe.each(["bimodal-ring-n128.fits.gz", "bimodal-nested-n64.fits.gz", "bimodal-multiorder.fits.gz"])(
  "nside-64 display grid of %s",
  (name) => {
    const expected = reference.maps[name]?.grid64;
    if (!expected) throw new Error(`no grid reference for ${name}`);
    const grid = toDisplayGrid(load(name), 64);

    it("matches the reference on its 400 most probable pixels and sums to 1", () => {
      for (const [pix, prob] of expected.top) expect(relativeDifference(grid.probability[pix] ?? 0, prob)).toBeLessThan(1e-9);
      expect(grid.probability.reduce((a, b) => a + b, 0)).toBeCloseTo(expected.sum, 9);
    });

    it("has credible levels whose 90 % region has the reference grid's area", () => {
      let inside = 0;
      for (let i = 0; i < grid.probability.length; i++) if ((grid.credibleLevel[i] ?? 1) - (grid.probability[i] ?? 0) < 0.9) inside++;
      expect(relativeDifference(inside * pixelAreaSr(6) * SR_TO_DEG2, expected.area90Deg2)).toBeLessThan(1e-9);
    });
  },
);

describe("stored display grid", () => {
  const grid = toDisplayGrid(load("bimodal-multiorder.fits.gz"), 64);

  it("round-trips through its binary form within float32 precision", () => {
    const bytes = encodeDisplayGrid(grid);
    expect(bytes.length).toBe(12 + 4 * 49_152);
    const back = decodeDisplayGrid(bytes);
    expect(back.nside).toBe(64);
    for (let i = 0; i < grid.probability.length; i += 97) {
      expect(Math.abs((back.probability[i] ?? 0) - (grid.probability[i] ?? 0))).toBeLessThanOrEqual(1e-7 * (grid.probability[i] ?? 0) + 1e-45);
      expect(Math.abs((back.credibleLevel[i] ?? 0) - (grid.credibleLevel[i] ?? 0))).toBeLessThan(1e-5);
    }
  });

  it("refuses bytes that are not a stored grid", () => {
    const bytes = encodeDisplayGrid(grid);
    expect(() => decodeDisplayGrid(bytes.subarray(0, 1000))).toThrow(/needs 196620 bytes, got 1000/);
    expect(() => decodeDisplayGrid(new Uint8Array(16))).toThrow(/magic HPXG/);
  });

  it("answers coarse cone queries: within 3 % for a 12° cone, against the native map", () => {
    const native = load("bimodal-ring-n128.fits.gz");
    const coarse = displayGridToMap(grid);
    for (const [ra, dec, r] of [[123.4, -35, 12], [137, -27, 20]] as const) {
      expect(relativeDifference(coneProbability(coarse, ra, dec, r), coneProbability(native, ra, dec, r))).toBeLessThan(0.03);
    }
  });

  it("degrades by summing NESTED children and refuses to refine", () => {
    const coarse = degradeDisplayGrid(grid, 16);
    expect(coarse.probability.length).toBe(3072);
    expect(coarse.probability[5]).toBeCloseTo(grid.probability.subarray(5 * 16, 6 * 16).reduce((a, b) => a + b, 0), 15);
    expect(() => degradeDisplayGrid(coarse, 32)).toThrow(/cannot degrade/);
    expect(() => toDisplayGrid(load("bimodal-nested-n64.fits.gz"), 48)).toThrow(/power of two/);
  });

  it("spreads a coarse map evenly over finer grid pixels", () => {
    const map = load("bimodal-nested-n64.fits.gz");
    const fine = toDisplayGrid(map, 128);
    expect(fine.probability[4 * 1000 + 3]).toBeCloseTo((map.probability[1000] ?? 0) / 4, 15);
  });
});

describe("credibleRegionPoints", () => {
  const map = load("bimodal-ring-n128.fits.gz");

  it("samples the 90 % region: at least 0.9 of the probability, at most one pixel more", () => {
    const points = credibleRegionPoints(map, { maxPoints: 10_000, nside: 128 });
    const held = points.reduce((sum, p) => sum + p.prob, 0);
    const largest = Math.max(...points.map((p) => p.prob));
    expect(held).toBeGreaterThanOrEqual(0.9);
    expect(held).toBeLessThan(0.9 + largest);
    // at nside 128 the region's pixel count times the pixel area is the greedy 90 % area of that grid
    const grid = toDisplayGrid(map, 128);
    const area = credibleArea(grid.probability, grid.probability, pixelAreaSr(7) * SR_TO_DEG2, 0.9);
    expect(points.length * pixelAreaSr(7) * SR_TO_DEG2).toBeCloseTo(area, 6);
  });

  it("coarsens until the list fits maxPoints", () => {
    const points = credibleRegionPoints(map, { maxPoints: 500 });
    expect(points.length).toBeLessThanOrEqual(500);
    expect(points.length).toBeGreaterThan(100);
    expect(points.reduce((sum, p) => sum + p.prob, 0)).toBeGreaterThanOrEqual(0.9);
  });

  it("puts every point near one of the two blobs", () => {
    const blobs = [{ raDeg: 123.4, decDeg: -35 }, { raDeg: 151, decDeg: -18 }];
    const points = credibleRegionPoints(map, { maxPoints: 2000 });
    expect(points.length).toBeGreaterThan(0);
    for (const p of points) {
      const nearest = Math.min(...blobs.map((b) => separationDeg(p, b)));
      expect(nearest).toBeLessThan(30);
    }
  });
});


describe("SkymapCache", () => {
  it("loads once per key and evicts the least recently used map past its byte budget", () => {
    const map = load("bimodal-nested-n64.fits.gz"); // 49 152 doubles = 393 216 bytes
    const cache = new SkymapCache(2 * 393_216);
    let loads = 0;
    const loader = () => {
      loads++;
      return map;
    };
    cache.get("a", loader);
    cache.get("b", loader);
    cache.get("a", loader); // a is now the most recent
    expect(loads).toBe(2);
    cache.get("c", loader); // over budget: b goes
    expect(cache.size).toBe(2);
    cache.get("a", loader);
    expect(loads).toBe(3);
    cache.get("b", loader);
    expect(loads).toBe(4);
  });
});
