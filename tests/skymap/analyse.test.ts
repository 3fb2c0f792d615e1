import { describe, expect, it } from "vitest";
import { analyseSkymap, coneProbability, type SkymapMap, type SkymapSummary } from "@/lib/skymap";
import { fixtureBytes, reference, relativeDifference, separationDeg } from "./fixture-files";

// Reference figures: healpy + numpy (Debian python3-healpy), tests/fixtures/scripts/skymap_make_fixtures.py
function analyse(name: string): { summary: SkymapSummary; map: SkymapMap } {
  const result = analyseSkymap(fixtureBytes(name));
  if (!result.ok) throw new Error(`${name}: ${result.error.message}`);
  return result;
}

describe.each(Object.entries(reference.maps))("%s against healpy + numpy", (name, expected) => {
  const { summary, map } = analyse(name);

  it("reads the layout, resolution and total", () => {
    expect(summary.layout).toBe(expected.layout);
    expect(summary.pixelCount).toBe(expected.pixelCount);
    expect(summary.nside).toBe(expected.nside);
    expect(summary.maxOrder).toBe(expected.maxOrder);
    expect(relativeDifference(summary.totalProbability, expected.totalProbability)).toBeLessThan(1e-9);
  });

  it("gives the 50 % and 90 % credible areas within 1 %", () => {
    expect(relativeDifference(summary.area50Deg2, expected.area50Deg2)).toBeLessThan(0.01);
    expect(relativeDifference(summary.area90Deg2, expected.area90Deg2)).toBeLessThan(0.01);
  });

  it("puts the peak on the same pixel centre", () => {
    expect(separationDeg(summary.peak, expected.peak)).toBeLessThan(1e-6);
  });

  it("gives cone probabilities within 1 % (pixel-centre inclusion, as query_disc inclusive=False)", () => {
    for (const cone of expected.cones) {
      const got = coneProbability(map, cone.raDeg, cone.decDeg, cone.radiusDeg);
      expect(Math.abs(got - cone.probability)).toBeLessThanOrEqual(0.01 * cone.probability + 1e-12);
    }
  });
});

describe("normalisation", () => {
  it("rescales a map whose total is 0.98 and says so", () => {
    const { summary, map } = analyse("bimodal-ring-n128.fits.gz");
    expect(summary.normalised).toBe(true);
    expect(summary.warnings.join(" ")).toMatch(/total probability 0\.98.* normalised/);
    expect(map.probability.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
  });

  it("leaves a map summing to 1 within 1e-3 unflagged and names a fallback column", () => {
    const { summary } = analyse("bimodal-nested-n64.fits.gz");
    expect(summary.normalised).toBe(false);
    expect(summary.warnings).toEqual(["no PROB column; read the first column, WEIGHT"]);
  });
});

describe("flat and multi-order forms of the same map agree", () => {
  const flat = analyse("bimodal-ring-n128.fits.gz");
  const multi = analyse("bimodal-multiorder.fits.gz");
  const coarse = analyse("bimodal-nested-n64.fits.gz");

  it("has the same credible areas within 1 %", () => {
    for (const other of [multi, coarse]) {
      expect(relativeDifference(other.summary.area50Deg2, flat.summary.area50Deg2)).toBeLessThan(0.01);
      expect(relativeDifference(other.summary.area90Deg2, flat.summary.area90Deg2)).toBeLessThan(0.01);
    }
  });

  it("puts the peak within one nside-64 pixel (0.92°)", () => {
    expect(separationDeg(multi.summary.peak, flat.summary.peak)).toBeLessThan(0.92);
    expect(separationDeg(coarse.summary.peak, flat.summary.peak)).toBeLessThan(0.92);
  });

  it("encloses the same probability in cones within 1 %", () => {
    const cones: Array<[number, number, number]> = [
      [123.4, -35, 5], [123.4, -35, 12], [151, -18, 9], [137, -27, 20], [140, -25, 100],
    ];
    for (const [ra, dec, r] of cones) {
      const reference = coneProbability(flat.map, ra, dec, r);
      expect(relativeDifference(coneProbability(multi.map, ra, dec, r), reference)).toBeLessThan(0.01);
      expect(relativeDifference(coneProbability(coarse.map, ra, dec, r), reference)).toBeLessThan(0.01);
    }
  });
});

describe("single Fisher blob against its closed form (Fisher 1953, Proc. R. Soc. A 217, 295)", () => {
  const analytic = reference.singleFisherAnalytic;
  const { summary, map } = analyse("single-nested-n128.fits.gz");

  it("has credible areas within 1 % of the analytic cap areas", () => {
    expect(relativeDifference(summary.area50Deg2, analytic.area50Deg2)).toBeLessThan(0.01);
    expect(relativeDifference(summary.area90Deg2, analytic.area90Deg2)).toBeLessThan(0.01);
  });

  it("peaks within half an nside-128 pixel of the mean direction", () => {
    expect(separationDeg(summary.peak, analytic)).toBeLessThan(0.23 * 1.5);
  });

  it("encloses the analytic cap probability", () => {
    // 6° cap: 1 %; 2° cap: 2 %, since whole 0.46° pixels are counted on a cone only ~4 pixels wide
    const [small, large] = analytic.cap;
    if (!small || !large) throw new Error("fixture lacks caps");
    const got = (r: number) => coneProbability(map, analytic.raDeg, analytic.decDeg, r);
    expect(relativeDifference(got(large.radiusDeg), large.probability)).toBeLessThan(0.01);
    expect(relativeDifference(got(small.radiusDeg), small.probability)).toBeLessThan(0.02);
  });
});

describe("cone edge cases", () => {
  const { map } = analyse("bimodal-multiorder.fits.gz");
  const flat = analyse("bimodal-nested-n64.fits.gz").map;

  it("grows with the radius and reaches 1 at 180°", () => {
    for (const m of [map, flat]) {
      let previous = 0;
      for (const r of [0, 1, 5, 20, 60, 89.9, 90, 90.1, 135, 179.9]) {
        const p = coneProbability(m, 130, -30, r);
        expect(p).toBeGreaterThanOrEqual(previous - 1e-12);
        previous = p;
      }
      expect(coneProbability(m, 130, -30, 180)).toBeCloseTo(1, 12);
    }
  });

  it("refuses a declination beyond the pole or a negative radius with a typed error", () => {
    expect(() => coneProbability(map, 0, 91, 1)).toThrow(/decDeg in \[-90, 90\]/);
    expect(() => coneProbability(map, 0, 0, -1)).toThrowError(expect.objectContaining({ code: "bad-query" }));
  });
});

describe("unusual but valid files (tests/fixtures/skymap/variants)", () => {
  it("infers NSIDE from the pixel count when the keyword is missing", () => {
    const { summary } = analyse("variants/no-nside.fits");
    const good = analyse("malformed/good-n16.fits").summary;
    expect(summary.warnings).toContain("NSIDE missing; inferred 16 from 3072 pixels");
    expect(summary.area90Deg2).toBe(good.area90Deg2);
  });

  it("assumes equatorial coordinates, with a warning, when COORDSYS is missing", () => {
    expect(analyse("variants/no-coordsys.fits").summary.warnings).toContain("COORDSYS missing; assumed equatorial (C)");
  });

  it("warns when multi-order pixels leave part of the sky uncovered", () => {
    // covered fraction computed by the fixture script: Σ 4^-order / 12 over the 200 rows kept
    const { coveredFraction } = JSON.parse(new TextDecoder().decode(fixtureBytes("variants/multiorder-partial.json"))) as {
      coveredFraction: number;
    };
    const { summary } = analyse("variants/multiorder-partial.fits");
    expect(summary.warnings).toContain(`multi-order pixels cover only ${(100 * coveredFraction).toFixed(2)} % of the sky`);
  });

  it("reads a multi-order map with PROB per pixel like the same map with PROBDENSITY", () => {
    const byProb = analyse("variants/multiorder-prob.fits.gz");
    const byDensity = analyse("bimodal-multiorder.fits.gz");
    expect(byProb.summary.warnings).toContain("no PROBDENSITY column; PROB read as probability per pixel");
    expect(relativeDifference(byProb.summary.area50Deg2, byDensity.summary.area50Deg2)).toBeLessThan(1e-9);
    expect(relativeDifference(byProb.summary.area90Deg2, byDensity.summary.area90Deg2)).toBeLessThan(1e-9);
    expect(separationDeg(byProb.summary.peak, byDensity.summary.peak)).toBeLessThan(1e-9);
    expect(coneProbability(byProb.map, 123.4, -35, 5)).toBeCloseTo(coneProbability(byDensity.map, 123.4, -35, 5), 12);
  });
});
