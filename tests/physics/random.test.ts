import { describe, expect, it } from "vitest";
import reference from "@/tests/fixtures/physics/xoshiro128ss.json";
import { SeededRandom, seedStateFromString } from "@/lib/physics/random";

describe("xoshiro128** port", () => {
  // Reference outputs: tests/fixtures/scripts/physics_xoshiro128ss_reference.py, an independent Python rendering
  // of Blackman & Vigna's reference C code (xoshiro128starstar.c).
  for (const testCase of reference.cases) {
    it(`matches the reference sequence for state ${testCase.state.join(",")}`, () => {
      const random = new SeededRandom(testCase.state as [number, number, number, number]);
      const outputs = testCase.outputs.map(() => random.nextUint32());
      expect(outputs).toEqual(testCase.outputs);
    });
  }
});

describe("string seeding", () => {
  it("gives the same stream for the same seed and different streams for different seeds", () => {
    const a = new SeededRandom("N1/trigger-17/3");
    const b = new SeededRandom("N1/trigger-17/3");
    const c = new SeededRandom("N1/trigger-17/4");
    const seqA = Array.from({ length: 8 }, () => a.nextUint32());
    expect(Array.from({ length: 8 }, () => b.nextUint32())).toEqual(seqA);
    expect(Array.from({ length: 8 }, () => c.nextUint32())).not.toEqual(seqA);
  });

  it("never yields the all-zero state xoshiro cannot leave", () => {
    for (const seed of ["", "a", "0", "\u0000", "x".repeat(1000)]) {
      expect(seedStateFromString(seed).some((word) => word !== 0)).toBe(true);
    }
  });
});

/** Standard normal CDF through erf from Abramowitz & Stegun 1964 Eq. 7.1.26 (|error| < 1.5e-7). */
function normalCdf(x: number): number {
  const z = Math.abs(x) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * z);
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  const erf = 1 - poly * Math.exp(-z * z);
  return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
}

describe("ziggurat normals (Marsaglia & Tsang 2000)", () => {
  it("have mean 0 and variance 1 within sampling error, and 68.3 % inside ±1", () => {
    const random = new SeededRandom("normal-moments");
    const n = 200_000;
    let sum = 0;
    let sumSq = 0;
    let inside = 0;
    for (let i = 0; i < n; i++) {
      const x = random.normal();
      sum += x;
      sumSq += x * x;
      if (Math.abs(x) < 1) inside++;
    }
    const mean = sum / n;
    const variance = sumSq / n - mean * mean;
    // Standard errors: 1/√n for the mean, √(2/n) for the variance; 5σ bounds.
    expect(Math.abs(mean)).toBeLessThan(5 / Math.sqrt(n));
    expect(Math.abs(variance - 1)).toBeLessThan(5 * Math.sqrt(2 / n));
    // Φ(1) − Φ(−1) = 0.682689 (standard normal tables).
    expect(Math.abs(inside / n - 0.682689)).toBeLessThan(5 * Math.sqrt((0.6827 * 0.3173) / n));
  });

  it("put 2(1 − Φ(r)) of the draws in the tail beyond the ziggurat's r = 3.4426 (the tail branch)", () => {
    const random = new SeededRandom("normal-tail");
    const n = 2_000_000;
    const r = 3.442619855899;
    let tail = 0;
    for (let i = 0; i < n; i++) if (Math.abs(random.normal()) > r) tail++;
    // erfc(r/√2) = 5.761085e-4 from Python's math.erfc; binomial standard error, 5σ bound.
    const expected = 5.761085123916405e-4;
    expect(Math.abs(tail / n - expected)).toBeLessThan(5 * Math.sqrt((expected * (1 - expected)) / n));
  });

  it("pass a Kolmogorov–Smirnov test against Φ (layers, wedges and tail together)", () => {
    const random = new SeededRandom("normal-ks");
    const n = 1_000_000;
    const draws = Float64Array.from({ length: n }, () => random.normal()).sort();
    let d = 0;
    draws.forEach((x, i) => {
      const cdf = normalCdf(x);
      d = Math.max(d, (i + 1) / n - cdf, cdf - i / n);
    });
    // Critical value 1.63/√n at the 1 % level (Kolmogorov's asymptotic distribution, standard tables).
    expect(d).toBeLessThan(1.63 / Math.sqrt(n));
  });

  it("match Φ bin by bin (χ² over 160 bins of width 0.05), which the thin wedges of each layer would spoil", () => {
    const random = new SeededRandom("normal-chi2");
    const n = 4_000_000;
    const width = 0.05;
    const bins = 160;
    const low = -4;
    const counts = new Float64Array(bins + 2);
    for (let i = 0; i < n; i++) {
      const bin = Math.floor((random.normal() - low) / width);
      counts[bin < 0 ? 0 : bin >= bins ? bins + 1 : bin + 1]! += 1;
    }
    let chi2 = 0;
    for (let b = 0; b < bins + 2; b++) {
      const lower = b === 0 ? -Infinity : low + (b - 1) * width;
      const upper = b === bins + 1 ? Infinity : low + b * width;
      const expected = n * ((upper === Infinity ? 1 : normalCdf(upper)) - (lower === -Infinity ? 0 : normalCdf(lower)));
      chi2 += ((counts[b]! - expected) ** 2) / expected;
    }
    // 161 degrees of freedom: mean 161, sd √322 ≈ 18; a 5σ bound (normal approximation, common practice).
    expect(chi2).toBeLessThan(161 + 5 * Math.sqrt(2 * 161));
  });

  it("keeps uniforms strictly inside (0, 1)", () => {
    const random = new SeededRandom([0xffffffff, 0xffffffff, 0xffffffff, 0xffffffff]);
    for (let i = 0; i < 10_000; i++) {
      const u = random.uniform();
      expect(u).toBeGreaterThan(0);
      expect(u).toBeLessThan(1);
    }
  });
});
