import { describe, expect, it } from "vitest";
import fixture from "@/tests/fixtures/physics/taylor-t4-tracks.json";
import { computeDerived, defaultPhysicsSettings, type TriggerPhysicsInput } from "@/lib/physics";
import { SeededRandom } from "@/lib/physics/random";

// Criteria: lib/physics/chirp-shape.ts. Chirps from the scipy TaylorT4 fixture (physics_taylor_t4_tracks.py).
const bns = fixture.tracks[0] as (typeof fixture.tracks)[number];
const base: TriggerPhysicsInput = {
  frequencyTrack: { t: bns.t, f: bns.f },
  masses: { m1: { mean: 1.4, sd: 0.05 }, m2: { mean: 1.4, sd: 0.05 } },
  secondsSinceEventTimeAtReceipt: 10,
  networkSnr: 12,
  falseAlarmRatePerYear: 0.01,
};
const withTrack = (t: number[], f: number[]) => computeDerived({ ...base, frequencyTrack: { t, f } }, defaultPhysicsSettings, "shape");

describe("chirp-shape check", () => {
  for (const noise of [0.01, 0.05]) {
    it(`passes noisy chirps (${noise * 100} % noise)`, () => {
      for (const track of fixture.tracks.slice(0, 4)) {
        const random = new SeededRandom(`${track.name}/${noise}`);
        const derived = computeDerived(
          { ...base, frequencyTrack: { t: track.t, f: track.f.map((v) => v * (1 + noise * random.normal())) }, masses: { m1: { mean: track.mass1DetectorFrame, sd: 0 }, m2: { mean: track.mass2DetectorFrame, sd: 0 } } },
          defaultPhysicsSettings,
          "shape",
        );
        expect(derived.fit?.shapeCheck?.passed, `${track.name}: ${derived.fit?.shapeCheck?.failure}`).toBe(true);
        expect(derived.chirpMass).not.toBeNull();
      }
    });
  }

  const random = new SeededRandom("non-chirps");
  const t = Array.from({ length: 200 }, (_, i) => -10 + i * 0.05);
  const cases: [string, number[], number[]][] = [
    ["a straight line 30 → 300 Hz", t, t.map((time) => 300 + 27 * time + 0.5 * random.normal())],
    ["a constant tone with noise", t, t.map(() => 120 + 0.5 * random.normal())],
    ["scattered points", t, t.map(() => 50 + 200 * random.uniform())],
    ["a chirp followed by a falling tail", [...bns.t.slice(0, 300), ...Array.from({ length: 100 }, (_, i) => 0.001 * (i + 1))],
      [...bns.f.slice(0, 300), ...Array.from({ length: 100 }, (_, i) => 200 - 1.5 * i)]],
  ];
  for (const [name, times, f] of cases) {
    it(`gives no chirp mass for ${name}`, () => {
      const derived = withTrack(times, f);
      expect(derived.chirpMass).toBeNull();
      expect(derived.chirpMassError).toMatch(/^(track-not-chirp-like|frequency-not-rising|non-physical-slope|degenerate-fit)/);
    });
  }
});

describe("track plausibility (stored, but no chirp mass)", () => {
  it("names samples outside 1 Hz – 10 kHz and a span over 10⁴ s (milliseconds)", () => {
    const high = withTrack([0, 1, 2, 3], [100, 200, 20_000, 30_000]);
    expect(high.chirpMass).toBeNull();
    expect(high.chirpMassError).toMatch(/^track-implausible: 2 samples outside .*f\[2\] = 20000 Hz/);
    const ms = bns.t.map((v) => v * 1000);
    const milliseconds = withTrack(ms, bns.f);
    expect(milliseconds.chirpMassError).toMatch(/^track-implausible: .*milliseconds/);
    expect(milliseconds.classProbabilities).not.toBeNull();
  });

  it("says plainly why an empty, one-sample or non-positive track is unusable", () => {
    expect(withTrack([], []).chirpMassError).toMatch(/^too-few-samples/);
    expect(withTrack([0], [30]).chirpMassError).toMatch(/^too-few-samples/);
    expect(withTrack([0, 1, 2], [30, 0, 40]).chirpMassError).toMatch(/^non-positive-frequency: sample 1/);
  });
});
