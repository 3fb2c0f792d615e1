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

describe("Box–Muller normals (Box & Muller 1958)", () => {
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

  it("keeps uniforms strictly inside (0, 1)", () => {
    const random = new SeededRandom([0xffffffff, 0xffffffff, 0xffffffff, 0xffffffff]);
    for (let i = 0; i < 10_000; i++) {
      const u = random.uniform();
      expect(u).toBeGreaterThan(0);
      expect(u).toBeLessThan(1);
    }
  });
});
