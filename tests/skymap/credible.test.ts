import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { credibleArea, credibleAreas, credibleLevels } from "@/lib/skymap/credible";

/** The textbook definition (common practice): stable sort by density, take until the level is reached. */
function bySorting(density: number[], probability: number[], area: number[], level: number): number {
  const order = density.map((_, i) => i).sort((a, b) => (density[b] ?? 0) - (density[a] ?? 0) || a - b);
  let prob = 0;
  let taken = 0;
  for (const i of order) {
    if (prob >= level) break;
    prob += probability[i] ?? 0;
    taken += area[i] ?? 0;
  }
  return taken;
}

// Densities drawn from a few magnitudes with many repeats, to exercise ties and the histogram passes
const pixels = (min: number, max: number) =>
  fc.array(
    fc.record({
      density: fc.oneof(fc.constantFrom(0, 1e-12, 0.5, 1, 3), fc.double({ min: 0, max: 10, noNaN: true })),
      area: fc.constantFrom(1, 0.25, 0.0625),
    }),
    { minLength: min, maxLength: max },
  );

function check(list: Array<{ density: number; area: number }>, level: number) {
  const density = list.map((p) => p.density);
  const rawProb = list.map((p) => p.density * p.area);
  const total = rawProb.reduce((a, b) => a + b, 0);
  fc.pre(total > 0);
  const probability = rawProb.map((p) => p / total);
  const area = list.map((p) => p.area);
  const arrays = [new Float64Array(density), new Float64Array(probability), new Float64Array(area)] as const;
  const got = credibleArea(...arrays, level);
  expect(got).toBeCloseTo(bySorting(density, probability, area, level), 9);
  // several levels share the first histogram pass
  const both = credibleAreas(...arrays, [level, 0.5]);
  expect(both[0]).toBe(got);
  expect(both[1]).toBeCloseTo(bySorting(density, probability, area, 0.5), 9);
}

describe("credibleArea equals the full-sort definition", () => {
  it("on small maps (sorted directly)", () => {
    fc.assert(fc.property(pixels(1, 200), fc.double({ min: 0.01, max: 0.999, noNaN: true }), check), { numRuns: 300 });
  });

  it("on maps large enough for the histogram passes", () => {
    fc.assert(fc.property(pixels(5000, 20000), fc.constantFrom(0.5, 0.9, 0.99), check), { numRuns: 15 });
  });

  it("on an equal-area map with one scalar area", () => {
    const n = 50_000;
    const density = new Float64Array(n);
    for (let i = 0; i < n; i++) density[i] = Math.exp(-((i % 997) / 50)) * (1 + (i % 7));
    const total = density.reduce((a, b) => a + b, 0);
    const probability = density.map((d) => d / total);
    const expected = bySorting(Array.from(density), Array.from(probability), new Array<number>(n).fill(2), 0.9);
    expect(credibleArea(density, probability, 2, 0.9)).toBe(expected);
  });

  it("when thousands of pixels share a density or sit in one narrow bin (repeated histogram passes)", () => {
    const n = 30_000;
    const cases = [
      (i: number) => 1 + ((i * 7919) % n) * 1e-13, // all inside one first-pass bin
      (i: number) => (i % 3 === 0 ? 0.5 : 1), // two tied values
      (i: number) => (i < 10 ? 5 : 1), // a few high pixels over a flat floor
    ];
    for (const make of cases) {
      const density = Float64Array.from({ length: n }, (_, i) => make(i));
      const total = density.reduce((a, b) => a + b, 0);
      const probability = density.map((d) => d / total);
      const area = Float64Array.from({ length: n }, (_, i) => (i % 2 ? 1 : 0.25));
      for (const level of [0.5, 0.9]) {
        const expected = bySorting(Array.from(density), Array.from(probability), Array.from(area), level);
        expect(credibleArea(density, probability, area, level)).toBeCloseTo(expected, 9);
      }
    }
  });
});

describe("credibleLevels", () => {
  it("gives each pixel the probability ranked at or above it", () => {
    const density = new Float64Array([0.1, 0.4, 0.2, 0.3]);
    const levels = credibleLevels(density, density);
    expect(Array.from(levels).map((v) => Number(v.toFixed(12)))).toEqual([1, 0.4, 0.9, 0.7]);
  });
});
