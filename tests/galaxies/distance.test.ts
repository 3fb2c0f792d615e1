import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { analyseSkymap, ansatzMoments, ansatzNorm } from "@/lib/skymap";

// Reference figures: tests/fixtures/scripts/galaxies_make_fixtures.py (scipy.integrate.quad per pixel, Simpson's rule
// over the whole map's marginal), for the ansatz of Singer et al. 2016, ApJL 829 L15 eq. 1 / ApJS 226 10 §2.2.
const dir = new URL("../fixtures/galaxies/", import.meta.url);
const reference = JSON.parse(readFileSync(new URL("reference.json", dir), "utf8")) as {
  moments: Array<{ muMpc: number; sigmaMpc: number; meanMpc: number; stdMpc: number; normPerMpc2: number }>;
  flat: { whole: { meanMpc: number; stdMpc: number }; peak: { meanMpc: number; stdMpc: number } };
  multiorder: { whole: { meanMpc: number; stdMpc: number }; peak: { meanMpc: number; stdMpc: number } };
};
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe("distance moments of one pixel against scipy quadrature", () => {
  for (const c of reference.moments) {
    it(`μ ${c.muMpc} Mpc, σ ${c.sigmaMpc} Mpc`, () => {
      const m = ansatzMoments(c.muMpc, c.sigmaMpc);
      expect(m).not.toBeNull();
      expect(rel(m?.meanMpc ?? 0, c.meanMpc)).toBeLessThan(1e-8);
      expect(rel(m?.stdMpc ?? 0, c.stdMpc)).toBeLessThan(1e-7);
      expect(rel(ansatzNorm(c.muMpc, c.sigmaMpc), c.normPerMpc2)).toBeLessThan(1e-8);
    });
  }
  it("a pixel without distance has no moments", () => {
    expect(ansatzMoments(Number.POSITIVE_INFINITY, 1)).toBeNull();
  });
});

describe("3D maps: whole-map and most-probable-pixel distance", () => {
  for (const [file, ref] of [["map3d-nested-n32.fits.gz", reference.flat], ["map3d-multiorder.fits.gz", reference.multiorder]] as const) {
    it(file, () => {
      const result = analyseSkymap(new Uint8Array(readFileSync(new URL(file, dir))));
      if (!result.ok) throw result.error;
      const d = result.summary.distance;
      expect(d).toBeDefined();
      // Simpson's rule on a 0.025 Mpc grid: agreement to ~1e-6 is what the reference deserves
      expect(rel(d?.meanMpc ?? 0, ref.whole.meanMpc)).toBeLessThan(1e-5);
      expect(rel(d?.stdMpc ?? 0, ref.whole.stdMpc)).toBeLessThan(1e-5);
      expect(rel(d?.atPeak?.meanMpc ?? 0, ref.peak.meanMpc)).toBeLessThan(1e-8);
      expect(rel(d?.atPeak?.stdMpc ?? 0, ref.peak.stdMpc)).toBeLessThan(1e-7);
    });
  }
  it("a map without distance columns reads as before", () => {
    const result = analyseSkymap(new Uint8Array(readFileSync(new URL("../skymap/bimodal-multiorder.fits.gz", dir))));
    if (!result.ok) throw result.error;
    expect(result.summary.distance).toBeUndefined();
  });
});
