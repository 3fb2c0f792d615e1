import { describe, expect, it } from "vitest";
import { iscoGravitationalWaveFrequencyHz, iscoRadius, iscoSpecificEnergy, schwarzschildIscoFrequencyHz } from "@/lib/physics/kerr";
import { finalSpinAligned, radiatedEnergyFraction, ringdownMode } from "@/lib/physics/remnant";
import { SUN_MASS_TIME_S } from "@/lib/physics/constants";

describe("ISCO (Bardeen, Press & Teukolsky 1972)", () => {
  it("gives about 4.4 kHz for 1 M☉ and scales as 1/M (Maggiore 2008, Gravitational Waves Vol. 1, §4.1)", () => {
    expect(schwarzschildIscoFrequencyHz(1)).toBeGreaterThan(4350);
    expect(schwarzschildIscoFrequencyHz(1)).toBeLessThan(4450);
    expect(schwarzschildIscoFrequencyHz(10) * 10).toBeCloseTo(schwarzschildIscoFrequencyHz(1), 9);
    expect(schwarzschildIscoFrequencyHz(2.8)).toBeCloseTo(schwarzschildIscoFrequencyHz(1) / 2.8, 9);
  });

  // Radii r_isco/M from Bardeen, Press & Teukolsky 1972 (ApJ 178, 347) Eq. 2.21 evaluated by hand: 6
  // (Schwarzschild), 4.23300, 2.32088, 1.45450; extremal 1 (prograde) and 9 (retrograde).
  const table: [number, number, number][] = [
    [0, 6, 1e-12],
    [0.5, 4.233, 5e-4],
    [0.9, 2.321, 5e-4],
    [0.99, 1.4545, 5e-4],
    [1, 1, 1e-12],
    [-1, 9, 1e-12],
  ];
  for (const [chi, radius, tolerance] of table) {
    it(`has r_isco = ${radius} M at χ = ${chi}`, () => {
      expect(Math.abs(iscoRadius(chi) - radius)).toBeLessThanOrEqual(tolerance);
    });
  }

  it("satisfies the marginal-stability condition r² − 6r ± 8χ√r − 3χ² = 0 (BPT 1972 §II) for any spin", () => {
    for (let chi = -0.99; chi <= 0.99; chi += 0.11) {
      const r = iscoRadius(chi);
      expect(Math.abs(r * r - 6 * r + 8 * chi * Math.sqrt(r) - 3 * chi * chi)).toBeLessThan(1e-9);
    }
  });

  it("gives the textbook ISCO binding energies: 1 − √(8/9) ≈ 5.7 % and 1 − 1/√3 ≈ 42 % (BPT 1972)", () => {
    expect(1 - iscoSpecificEnergy(0)).toBeCloseTo(1 - Math.sqrt(8 / 9), 12);
    expect(1 - iscoSpecificEnergy(1)).toBeCloseTo(1 - 1 / Math.sqrt(3), 12);
  });

  it("puts the extremal prograde ISCO at orbital Ω = c³/(2GM) (BPT 1972 Eq. 2.16 with r = M, a = M)", () => {
    expect(iscoGravitationalWaveFrequencyHz(1, 1)).toBeCloseTo(1 / (2 * Math.PI * SUN_MASS_TIME_S), 6);
  });
});

describe("final spin and mass of the remnant", () => {
  // Numerical relativity, equal masses, no spins: M_f/M = 0.95162 ± 0.00002 and χ_f = 0.68646 ± 0.00004
  // (Scheel et al. 2009, PRD 79, 024003). The fits' own accuracy is a few 10⁻³.
  it("reproduces the equal-mass non-spinning merger (χ_f ≈ 0.69)", () => {
    expect(Math.abs(finalSpinAligned(30, 30, 0, 0) - 0.68646)).toBeLessThan(0.005);
    expect(Math.abs(1 - radiatedEnergyFraction(30, 30, 0, 0) - 0.95162)).toBeLessThan(0.002);
  });

  it("tends to the test-particle limit: spin of the big hole, energy η (1 − Ẽ_isco)", () => {
    const eta = 1e-4 / (1 + 1e-4) ** 2;
    for (const chi of [-0.5, 0, 0.7]) {
      expect(finalSpinAligned(1, 1e-4, chi, 0)).toBeCloseTo(chi, 3);
      expect(radiatedEnergyFraction(1, 1e-4, chi, 0) / (eta * (1 - iscoSpecificEnergy(chi)))).toBeCloseTo(1, 2);
    }
  });

  it("is symmetric under exchanging the components and grows with aligned spin", () => {
    expect(finalSpinAligned(20, 10, 0.3, -0.2)).toBe(finalSpinAligned(10, 20, -0.2, 0.3));
    expect(radiatedEnergyFraction(20, 10, 0.3, -0.2)).toBe(radiatedEnergyFraction(10, 20, -0.2, 0.3));
    expect(finalSpinAligned(20, 20, 0.8, 0.8)).toBeGreaterThan(finalSpinAligned(20, 20, 0, 0));
    expect(finalSpinAligned(20, 20, -0.8, -0.8)).toBeLessThan(finalSpinAligned(20, 20, 0, 0));
    // Thorne 1974 (ApJ 191, 507): accretion spins a hole up to at most χ ≈ 0.998.
    expect(finalSpinAligned(20, 20, 1, 1)).toBeLessThanOrEqual(0.998);
  });
});

describe("ringdown, Berti, Cardoso & Will 2006 fit against quasinormal-mode tables", () => {
  // l = m = 2, n = 0 Kerr frequencies M ω = M ω_R − i M ω_I from the Leaver continued-fraction tables
  // (Leaver 1985; tabulated by Berti, Cardoso & Will 2006), values quoted from memory.
  const tables: [number, number, number][] = [
    [0, 0.37367, 0.08896],
    [0.7, 0.5326, 0.08079],
    [0.9, 0.67161, 0.06487],
  ];
  for (const [spin, omegaReal, omegaImag] of tables) {
    it(`matches M ω = ${omegaReal} − ${omegaImag} i at j = ${spin} within the fit's stated few-per-cent accuracy`, () => {
      const massSolar = 10;
      const mode = ringdownMode(massSolar, spin);
      expect(mode.ok).toBe(true);
      if (!mode.ok) return;
      const timeUnitS = SUN_MASS_TIME_S * massSolar;
      const expectedHz = omegaReal / (2 * Math.PI * timeUnitS);
      const expectedDampingS = timeUnitS / omegaImag;
      expect(Math.abs(mode.value.frequencyHz / expectedHz - 1)).toBeLessThan(0.02);
      // The fit is made separately for M ω_R and Q = ω_R/(2 ω_I); τ = 2Q/ω_R compounds both errors.
      expect(Math.abs(mode.value.qualityFactor / (omegaReal / (2 * omegaImag)) - 1)).toBeLessThan(0.02);
      expect(Math.abs(mode.value.dampingTimeS / expectedDampingS - 1)).toBeLessThan(0.03);
    });
  }

  it("refuses spins outside the co-rotating fit with a typed failure", () => {
    expect(ringdownMode(10, -0.3)).toMatchObject({ ok: false, reason: "spin-outside-fit" });
    expect(ringdownMode(10, 1)).toMatchObject({ ok: false, reason: "spin-outside-fit" });
  });
});
