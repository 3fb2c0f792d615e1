import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { evaluate, gaussNewton, inverseNormalOf, leadingOrderEvaluator } from "@/lib/physics/chirp-fit-model";
import { fitTimeTrack } from "@/lib/physics/chirp-fit-time";
import { chirpMassFromComponents } from "@/lib/physics/chirp";
import { syntheticTimeTrack } from "./track-helpers";

// Tracks are generated from the Peters & Mathews 1963 chirp f(t) itself (issue 3: "synthetic tracks generated
// from the formula"), so a noiseless fit must return the input chirp mass and coalescence time.
const BNS_CHIRP_MASS = chirpMassFromComponents(1.4, 1.4);
const BBH_CHIRP_MASS = chirpMassFromComponents(36, 29);

describe("fitTimeTrack, noiseless", () => {
  const cases = [
    { name: "neutron-star pair, 60 s to 1 s before merger", chirpMass: BNS_CHIRP_MASS, tcS: 3, startS: -57, endS: 2 },
    { name: "black-hole pair, last 0.2 s", chirpMass: BBH_CHIRP_MASS, tcS: 0.01, startS: -0.2, endS: -0.01 },
  ];
  for (const c of cases) {
    it(`recovers 𝓜 to 0.1 % and t_c for a ${c.name}`, () => {
      const track = syntheticTimeTrack({ ...c, samples: 400 });
      const fit = fitTimeTrack({ t: track.t, f: track.f });
      expect(fit.ok).toBe(true);
      if (!fit.ok) return;
      expect(Math.abs(fit.value.chirpMassDetectorFrame / c.chirpMass - 1)).toBeLessThan(1e-3);
      expect(Math.abs(fit.value.coalescenceTimeS - c.tcS)).toBeLessThan(1e-6 * Math.abs(c.endS - c.startS) + 1e-9);
      expect(fit.value.samplesUsed).toBe(400);
      expect(fit.value.residualRmsHz).toBeLessThan(1e-6);
    });
  }
});

describe("fitTimeTrack with 1 % frequency noise", () => {
  const realisations = 200;
  function pulls(withSigma: boolean) {
    const chirpPulls: number[] = [];
    const tcPulls: number[] = [];
    for (let k = 0; k < realisations; k++) {
      const track = syntheticTimeTrack({
        chirpMass: BNS_CHIRP_MASS, tcS: 3, startS: -40, endS: 1, samples: 300, relativeNoise: 0.01, seed: `noise-${k}`,
      });
      const fit = fitTimeTrack(withSigma ? track : { t: track.t, f: track.f });
      if (!fit.ok) throw new Error(fit.detail);
      chirpPulls.push((fit.value.chirpMassDetectorFrame - BNS_CHIRP_MASS) / fit.value.chirpMassDetectorFrameSd);
      tcPulls.push((fit.value.coalescenceTimeS - 3) / fit.value.coalescenceTimeSd);
    }
    return { chirpPulls, tcPulls };
  }
  // For a correct 1σ error, |pull| < 1 in 68.3 % of realisations (binomial sd over 200 runs ≈ 3.3 %).
  const within = (values: number[], limit: number) => values.filter((v) => Math.abs(v) < limit).length / values.length;

  for (const withSigma of [true, false]) {
    it(`quotes honest uncertainties ${withSigma ? "with per-sample σ" : "from the scatter alone"}`, () => {
      const { chirpPulls, tcPulls } = pulls(withSigma);
      expect(within(chirpPulls, 1)).toBeGreaterThan(0.58);
      expect(within(chirpPulls, 1)).toBeLessThan(0.79);
      expect(within(chirpPulls, 3)).toBeGreaterThan(0.97);
      expect(within(tcPulls, 1)).toBeGreaterThan(0.58);
      expect(within(tcPulls, 1)).toBeLessThan(0.79);
    });
  }

  it("keeps a single noisy fit within its quoted uncertainty (3σ) and reports χ²/dof ≈ 1", () => {
    const track = syntheticTimeTrack({
      chirpMass: BBH_CHIRP_MASS, tcS: 0, startS: -0.25, endS: -0.02, samples: 200, relativeNoise: 0.01, seed: "single",
    });
    const fit = fitTimeTrack(track);
    expect(fit.ok).toBe(true);
    if (!fit.ok) return;
    expect(Math.abs(fit.value.chirpMassDetectorFrame - BBH_CHIRP_MASS)).toBeLessThan(3 * fit.value.chirpMassDetectorFrameSd);
    expect(fit.value.reducedChiSquare).toBeGreaterThan(0.7);
    expect(fit.value.reducedChiSquare).toBeLessThan(1.3);
    expect(fit.value.residualRmsHz).toBeGreaterThan(0);
  });
});

describe("fitTimeTrack on long tracks (start from a subsample, then the full data)", () => {
  it("recovers 𝓜 and t_c from 100 000 noiseless samples", () => {
    const track = syntheticTimeTrack({ chirpMass: BNS_CHIRP_MASS, tcS: 0.5, startS: -100, endS: 0, samples: 100_000 });
    const fit = fitTimeTrack({ t: track.t, f: track.f });
    expect(fit.ok && Math.abs(fit.value.chirpMassDetectorFrame / BNS_CHIRP_MASS - 1)).toBeLessThan(1e-6);
    expect(fit.ok && Math.abs(fit.value.coalescenceTimeS - 0.5)).toBeLessThan(1e-6);
  });

  // The full track is passed over only until a Gauss–Newton step falls below FULL_TRACK_STEP_TOLERANCE standard
  // errors; that last step is applied blind, and without σ the sandwich sums come from that last pass (leverages
  // from the pass before). Iterating on to a 10⁻⁹ step, then summing afresh, must not change the answer noticeably.
  for (const [name, options] of [
    ["neutron-star pair, 100 000 samples", { chirpMass: BNS_CHIRP_MASS, tcS: 0.5, startS: -100, endS: 0, samples: 100_000 }],
    ["black-hole pair, 20 000 samples", { chirpMass: BBH_CHIRP_MASS, tcS: 0.01, startS: -0.3, endS: -0.01, samples: 20_000 }],
  ] as const) {
    for (const withSigma of [true, false]) {
      it(`stops within 10⁻³ standard errors of the converged minimum (${name}, ${withSigma ? "with σ" : "no σ"})`, () => {
        const track = syntheticTimeTrack({ ...options, relativeNoise: 0.01, seed: `converge-${name}` });
        const samples = { t: track.t, f: track.f, sigma: withSigma ? track.fSigma : undefined };
        const fit = fitTimeTrack(withSigma ? track : { t: track.t, f: track.f });
        if (!fit.ok) throw new Error(fit.detail);
        const { referenceFrequencyHz, amplitudePerS } = fit.value.model;
        const logA = Math.log(amplitudePerS);
        const converged = gaussNewton(samples, leadingOrderEvaluator(samples, referenceFrequencyHz), { logA, tc: fit.value.coalescenceTimeS }, 1e-9);
        if (!converged.ok) throw new Error(converged.detail);
        // 𝓜 ∝ A^(3/5), so sd(ln A) = (5/3) sd(𝓜)/𝓜.
        const logASd = ((5 / 3) * fit.value.chirpMassDetectorFrameSd) / fit.value.chirpMassDetectorFrame;
        expect(Math.abs(converged.value.point.logA - logA) / logASd).toBeLessThan(1e-3);
        expect(Math.abs(converged.value.point.tc - fit.value.coalescenceTimeS) / fit.value.coalescenceTimeSd).toBeLessThan(1e-3);
        if (withSigma) return;
        // Sandwich (HC3) errors at the converged minimum, with that point's own N⁻¹ for the leverages.
        const at = converged.value.point;
        const plain = evaluate(samples, referenceFrequencyHz, at);
        const inverse = plain && inverseNormalOf(plain);
        const exact = inverse && evaluate(samples, referenceFrequencyHz, at, inverse);
        if (!inverse || !exact) throw new Error("no evaluation at the converged point");
        const [iaa, iat, itt] = inverse;
        const exactLogASd = Math.sqrt(iaa * iaa * exact.maa + 2 * iaa * iat * exact.mat + iat * iat * exact.mtt);
        const exactTcSd = Math.sqrt(iat * iat * exact.maa + 2 * iat * itt * exact.mat + itt * itt * exact.mtt);
        expect(Math.abs(logASd / exactLogASd - 1)).toBeLessThan(1e-4);
        expect(Math.abs(fit.value.coalescenceTimeSd / exactTcSd - 1)).toBeLessThan(1e-4);
      });
    }
  }

  it("quotes honest uncertainties for 5 000-sample tracks with 1 % noise", () => {
    let inside = 0;
    for (let k = 0; k < 100; k++) {
      const track = syntheticTimeTrack({ chirpMass: BNS_CHIRP_MASS, tcS: 2, startS: -60, endS: 1, samples: 5_000, relativeNoise: 0.01, seed: `long-${k}` });
      const fit = fitTimeTrack(track);
      if (!fit.ok) throw new Error(fit.detail);
      if (Math.abs(fit.value.chirpMassDetectorFrame - BNS_CHIRP_MASS) < fit.value.chirpMassDetectorFrameSd) inside++;
    }
    // 68.3 % expected; binomial sd over 100 runs ≈ 4.7 %.
    expect(inside).toBeGreaterThan(54);
    expect(inside).toBeLessThan(83);
  });
});

describe("bad time tracks give typed failures", () => {
  const good = syntheticTimeTrack({ chirpMass: 1.2, tcS: 1, startS: -10, endS: 0, samples: 10 });
  const cases: [string, { t: number[]; f: number[]; fSigma?: number[] }, string][] = [
    ["two samples", { t: [0, 1], f: [30, 31] }, "too-few-samples"],
    ["mismatched lengths", { t: [0, 1, 2], f: [30, 31] }, "length-mismatch"],
    ["a NaN frequency", { t: [0, 1, 2], f: [30, Number.NaN, 32] }, "non-finite-value"],
    ["an infinite time", { t: [0, Number.POSITIVE_INFINITY, 2], f: [30, 31, 32] }, "non-finite-value"],
    ["a zero frequency", { t: [0, 1, 2], f: [30, 0, 32] }, "non-positive-frequency"],
    ["a negative σ", { t: [0, 1, 2], f: [30, 31, 32], fSigma: [1, -1, 1] }, "non-positive-uncertainty"],
    ["a NaN σ", { t: [0, 1, 2], f: [30, 31, 32], fSigma: [1, 1, Number.NaN] }, "non-finite-value"],
    ["a time going back", { t: [0, 2, 1], f: [30, 31, 32] }, "times-not-increasing"],
    ["repeated times", { t: [0, 1, 1], f: [30, 31, 32] }, "times-not-increasing"],
    ["falling frequency", { t: good.t, f: [...good.f].reverse() }, "frequency-not-rising"],
    ["constant frequency", { t: [0, 1, 2, 3], f: [50, 50, 50, 50] }, "frequency-not-rising"],
    // Rising overall, but the two dominant high-frequency samples fall: f^(−8/3) then rises with time.
    ["a non-physical weighted slope", { t: [0, 1, 2, 3, 4], f: [1, 1, 1, 101, 100] }, "non-physical-slope"],
  ];
  for (const [name, track, reason] of cases) {
    it(`rejects ${name}`, () => {
      expect(fitTimeTrack(track)).toMatchObject({ ok: false, reason });
    });
  }

  it("names the first sample at fault", () => {
    expect(fitTimeTrack({ t: [0, 1, 2, 3], f: [30, 31, -1, 0] })).toMatchObject({ detail: "sample 2 has frequency -1 Hz" });
    expect(fitTimeTrack({ t: [0, 1, 2, 2], f: [30, 31, 32, 33] })).toMatchObject({ detail: "t[3] ≤ t[2]" });
    expect(fitTimeTrack({ t: [0, 1, 2], f: [30, 31, 32], fSigma: [1, 0, 1] })).toMatchObject({ detail: "fSigma 1 is 0" });
    expect(fitTimeTrack({ t: [0, 1, Number.NaN], f: [30, 31, 32] })).toMatchObject({ detail: "sample 2 is not a finite number" });
  });

  it("never throws on arbitrary arrays (fast-check)", () => {
    const value = fc.oneof(fc.double(), fc.constant(0), fc.double({ min: 1, max: 2000, noNaN: true }));
    fc.assert(
      fc.property(fc.array(value, { maxLength: 12 }), fc.array(value, { maxLength: 12 }), (t, f) => {
        const result = fitTimeTrack({ t, f });
        if (result.ok) {
          expect(result.value.chirpMassDetectorFrame).toBeGreaterThan(0);
          expect(Number.isFinite(result.value.chirpMassDetectorFrameSd)).toBe(true);
        } else {
          expect(typeof result.reason).toBe("string");
          expect(result.detail.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 500 },
    );
  });
});
