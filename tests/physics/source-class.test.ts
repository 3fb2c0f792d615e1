import fc from "fast-check";
import { describe, expect, it } from "vitest";
import fixture from "@/tests/fixtures/physics/planck18-distances.json";
import { computeSourceClasses, type SourceClassInput, type SourceClassSettings } from "@/lib/physics/source-class";

const settings: SourceClassSettings = { nsMaxMassSolar: 3, gapUpperMassSolar: 5, nsRadiusKm: 12, sampleCount: 20_000 };
const noSpin = { chi1: 0, chi2: 0, distanceMpc: null };
const masses = (m1: number, sd1: number, m2: number, sd2: number) => ({
  mass1DetectorFrame: { mean: m1, sd: sd1 },
  mass2DetectorFrame: { mean: m2, sd: sd2 },
});

function run(input: SourceClassInput, seed = "class-test", overrides: Partial<SourceClassSettings> = {}) {
  const result = computeSourceClasses(input, { ...settings, ...overrides }, seed);
  if (!result.ok) throw new Error(`${result.reason}: ${result.detail}`);
  return result.value;
}

// Class boundaries 3 and 5 M☉ (common practice); cases sit many σ inside one class.
describe("a case entirely inside one class gives ≈ 1 for it", () => {
  const cases: [string, SourceClassInput, keyof ReturnType<typeof run>["classProbabilities"]][] = [
    ["neutron-star pair", { ...masses(1.5, 0.05, 1.3, 0.05), ...noSpin }, "bns"],
    ["neutron star–black hole", { ...masses(10, 0.5, 1.4, 0.05), ...noSpin }, "nsbh"],
    ["black-hole pair", { ...masses(30, 2, 25, 2), ...noSpin }, "bbh"],
    ["lower mass gap", { ...masses(4, 0.1, 1.4, 0.05), ...noSpin }, "lowerGap"],
  ];
  for (const [name, input, key] of cases) {
    it(name, () => {
      const value = run(input);
      expect(value.classProbabilities[key]).toBeGreaterThan(0.999);
      expect(value.sampleCount).toBe(20_000);
    });
  }
});

describe("thresholds and remnant matter", () => {
  it("splits ≈ 0.5 / 0.5 when the lighter mass sits on the neutron-star maximum", () => {
    // Binomial sd with 20 000 samples is 0.0035; 0.02 is ≈ 6σ.
    const value = run({ ...masses(12, 0.1, 3.0, 0.3), ...noSpin });
    expect(Math.abs(value.classProbabilities.nsbh - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(value.classProbabilities.lowerGap - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(value.pNeutronStar - 0.5)).toBeLessThan(0.02);
  });

  it("splits ≈ 0.5 / 0.5 when the heavier mass sits on the gap's upper edge", () => {
    const value = run({ ...masses(5.0, 0.2, 1.3, 0.05), ...noSpin });
    expect(Math.abs(value.classProbabilities.nsbh - 0.5)).toBeLessThan(0.02);
    expect(Math.abs(value.classProbabilities.lowerGap - 0.5)).toBeLessThan(0.02);
  });

  it("honours the coordinator's thresholds", () => {
    const value = run({ ...masses(4, 0.05, 1.4, 0.05), ...noSpin }, "s", { nsMaxMassSolar: 2.5, gapUpperMassSolar: 3.5 });
    expect(value.classProbabilities.nsbh).toBeGreaterThan(0.999);
  });

  it("converts to the source frame with the Planck 2018 redshift (astropy distance for z = 0.5)", () => {
    const row = fixture.luminosityDistance.find((r) => r.z === 0.5);
    if (!row) throw new Error("fixture lacks z = 0.5");
    // 3.6 and 2.7 M☉ in the detector frame are 2.4 and 1.8 M☉ at z = 0.5: a neutron-star pair, not a gap object.
    const near = run({ ...masses(3.6, 0.01, 2.7, 0.01), chi1: 0, chi2: 0, distanceMpc: null });
    const far = run({ ...masses(3.6, 0.01, 2.7, 0.01), chi1: 0, chi2: 0, distanceMpc: { mean: row.dLMpc, sd: 1 } });
    expect(near.classProbabilities.lowerGap).toBeGreaterThan(0.999);
    expect(far.classProbabilities.bns).toBeGreaterThan(0.999);
  });

  it("counts matter for neutron-star pairs, none for black-hole pairs, and follows FHN 2018 for NS–BH", () => {
    expect(run({ ...masses(1.5, 0.05, 1.3, 0.05), ...noSpin }).pRemnantMatter).toBeGreaterThan(0.999);
    expect(run({ ...masses(30, 2, 25, 2), ...noSpin }).pRemnantMatter).toBe(0);
    // Heavy non-spinning hole swallows the star whole; a light, rapidly spinning hole disrupts it (FHN 2018 Eq. 4).
    expect(run({ ...masses(30, 1, 1.4, 0.05), ...noSpin }).pRemnantMatter).toBe(0);
    const spinning = run({ ...masses(6, 0.2, 1.2, 0.05), chi1: 0.9, chi2: 0, distanceMpc: null }, "s", { nsRadiusKm: 13 });
    expect(spinning.classProbabilities.nsbh).toBeGreaterThan(0.999);
    expect(spinning.pRemnantMatter).toBeGreaterThan(0.999);
  });

  it("uses the spin of whichever component ends up heavier", () => {
    const aligned = run({ ...masses(6, 0.2, 1.2, 0.05), chi1: 0.9, chi2: 0, distanceMpc: null }, "s");
    const swapped = run({ ...masses(1.2, 0.05, 6, 0.2), chi1: 0, chi2: 0.9, distanceMpc: null }, "s");
    expect(swapped.pRemnantMatter).toBeCloseTo(aligned.pRemnantMatter, 1);
    expect(swapped.classProbabilities.nsbh).toBeCloseTo(aligned.classProbabilities.nsbh, 1);
  });
});

describe("determinism and invariants", () => {
  const borderline: SourceClassInput = { ...masses(4.5, 1.5, 2.6, 0.6), chi1: 0.3, chi2: 0.1, distanceMpc: { mean: 200, sd: 60 } };

  it("returns identical output for the same input and seed", () => {
    expect(run(borderline, "N1/abc/2")).toEqual(run(borderline, "N1/abc/2"));
  });

  it("changes (slightly) with the seed", () => {
    expect(run(borderline, "N1/abc/2")).not.toEqual(run(borderline, "N1/abc/3"));
  });

  const positiveMass = fc.double({ min: 0.2, max: 150, noNaN: true });
  const spread = fc.double({ min: 0, max: 30, noNaN: true });
  const spin = fc.double({ min: -1, max: 1, noNaN: true });
  const distance = fc.option(fc.record({ mean: fc.double({ min: 1, max: 50_000, noNaN: true }), sd: fc.double({ min: 0, max: 20_000, noNaN: true }) }), { nil: null });

  it("gives probabilities in [0, 1] that sum to 1 for arbitrary valid inputs (fast-check)", () => {
    fc.assert(
      fc.property(positiveMass, spread, positiveMass, spread, spin, spin, distance, fc.string(), (m1, s1, m2, s2, chi1, chi2, d, seed) => {
        const result = computeSourceClasses({ ...masses(m1, s1, m2, s2), chi1, chi2, distanceMpc: d }, { ...settings, sampleCount: 400 }, seed);
        expect(result.ok).toBe(true);
        if (!result.ok) return;
        const p = result.value.classProbabilities;
        for (const value of [p.bns, p.nsbh, p.bbh, p.lowerGap, result.value.pNeutronStar, result.value.pRemnantMatter]) {
          expect(value).toBeGreaterThanOrEqual(0);
          expect(value).toBeLessThanOrEqual(1);
        }
        expect(Math.abs(p.bns + p.nsbh + p.bbh + p.lowerGap - 1)).toBeLessThan(1e-12);
        // Matter outside the hole needs a neutron star, so P(matter) ≤ P(NS).
        expect(result.value.pRemnantMatter).toBeLessThanOrEqual(result.value.pNeutronStar);
        expect(result.value.sampleCount).toBe(400);
      }),
      { numRuns: 200 },
    );
  });

  it("gives typed failures for invalid inputs and settings (fast-check)", () => {
    const bad = fc.oneof(fc.constant(Number.NaN), fc.constant(Number.POSITIVE_INFINITY), fc.double({ max: 0, noNaN: true }));
    fc.assert(
      fc.property(bad, positiveMass, (badMean, good) => {
        const result = computeSourceClasses({ ...masses(badMean, 1, good, 1), ...noSpin }, settings, "x");
        expect(result).toMatchObject({ ok: false, reason: "invalid-mass" });
      }),
      { numRuns: 100 },
    );
    const valid = { ...masses(10, 1, 1.4, 0.1), ...noSpin };
    expect(computeSourceClasses({ ...masses(10, -1, 1.4, 0.1), ...noSpin }, settings, "x")).toMatchObject({ ok: false, reason: "invalid-mass" });
    expect(computeSourceClasses({ ...valid, chi1: 1.5 }, settings, "x")).toMatchObject({ ok: false, reason: "invalid-spin" });
    expect(computeSourceClasses({ ...valid, distanceMpc: { mean: -5, sd: 1 } }, settings, "x")).toMatchObject({ ok: false, reason: "invalid-distance" });
    expect(computeSourceClasses({ ...valid, distanceMpc: { mean: 1e9, sd: 1 } }, settings, "x")).toMatchObject({ ok: false, reason: "distance-out-of-range" });
    expect(computeSourceClasses(valid, { ...settings, gapUpperMassSolar: 2 }, "x")).toMatchObject({ ok: false, reason: "invalid-settings" });
    expect(computeSourceClasses(valid, { ...settings, sampleCount: 0.5 }, "x")).toMatchObject({ ok: false, reason: "invalid-settings" });
    expect(computeSourceClasses(valid, { ...settings, nsRadiusKm: 0 }, "x")).toMatchObject({ ok: false, reason: "invalid-settings" });
  });
});
