import { describe, expect, it } from "vitest";
import { classStandardErrors, computeAstroProbability } from "@/lib/physics/p-astro";

const settings = { pAstroRatePerYear: 50, pAstroSnrThreshold: 8 };
const classes = { bns: 0.6, nsbh: 0.3, bbh: 0.05, lowerGap: 0.05 };

describe("probability of astrophysical origin (FGMC 2015 mixture, ρ⁻⁴ foreground of Schutz 2011)", () => {
  it("matches the mixture written out by hand: R·3ρ_th³/ρ⁴ against ρ·FAR", () => {
    const result = computeAstroProbability(10, 1, classes, settings);
    if (!result.ok) throw new Error(result.detail);
    const astro = (50 * 3 * 512) / 10 ** 4;
    expect(result.value.pAstro).toBeCloseTo(astro / (astro + 10), 12);
    expect(result.value.pAstro + result.value.pTerrestrial).toBeCloseTo(1, 12);
  });

  it("never falls when the false-alarm rate falls at the same SNR, for any SNR", () => {
    for (const snr of [6, 8, 10, 15, 30]) {
      let previous = -1;
      for (const far of [1e3, 10, 1, 0.1, 1e-3, 1e-6, 0]) {
        const result = computeAstroProbability(snr, far, classes, settings);
        if (!result.ok) throw new Error(result.detail);
        expect(result.value.pAstro).toBeGreaterThanOrEqual(previous);
        previous = result.value.pAstro;
      }
    }
  });

  it("splits pAstro by class so that byClass sums to pAstro (common practice)", () => {
    const result = computeAstroProbability(12, 0.5, classes, settings);
    if (!result.ok || !result.value.byClass) throw new Error("no byClass");
    const { bns, nsbh, bbh, lowerGap } = result.value.byClass;
    expect(bns + nsbh + bbh + lowerGap).toBeCloseTo(result.value.pAstro, 12);
  });

  it("gives the binomial Monte Carlo standard error √(p(1−p)/N)", () => {
    expect(classStandardErrors(classes, 20_000).bns).toBeCloseTo(Math.sqrt((0.6 * 0.4) / 20_000), 12);
    expect(classStandardErrors(classes, 20_000).bbh).toBeCloseTo(Math.sqrt((0.05 * 0.95) / 20_000), 12);
  });
});
