import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { chirpMassFromComponents, computeDerived, defaultPhysicsSettings, secondsToMergerAt, type Derived, type TriggerPhysicsInput } from "@/lib/physics";
import { syntheticTimeTrack } from "./track-helpers";

const chirpMass = chirpMassFromComponents(1.45, 1.3);
const earlyWarningTrack = syntheticTimeTrack({ chirpMass, tcS: 0, startS: -90, endS: -30, samples: 1_500, relativeNoise: 0.005, seed: "ew" });

const earlyWarning: TriggerPhysicsInput = {
  frequencyTrack: earlyWarningTrack,
  masses: { m1: { mean: 1.45, sd: 0.1 }, m2: { mean: 1.3, sd: 0.1 } },
  distanceMpc: { mean: 120, sd: 25 },
  secondsSinceEventTimeAtReceipt: -28,
};

/** Every number in the JSON is finite (JSON has no NaN/Infinity); returns the offending paths. */
function nonFinitePaths(value: unknown, path = "$"): string[] {
  if (typeof value === "number") return Number.isFinite(value) ? [] : [path];
  if (Array.isArray(value)) return value.flatMap((v, i) => nonFinitePaths(v, `${path}[${i}]`));
  if (value !== null && typeof value === "object") return Object.entries(value).flatMap(([k, v]) => nonFinitePaths(v, `${path}.${k}`));
  return [];
}

/** Each block is either present with a null error, or null with a string reason. */
function expectNullWithReason(derived: Derived) {
  const pairs: [unknown, string | null][] = [
    [derived.chirpMass, derived.chirpMassError],
    [derived.coalescenceTime, derived.coalescenceTimeError],
    [derived.secondsToMerger, derived.secondsToMergerError],
    [derived.classProbabilities, derived.classProbabilitiesError],
    [derived.pNeutronStar, derived.pNeutronStarError],
    [derived.pRemnantMatter, derived.pRemnantMatterError],
    [derived.mergerFrequency, derived.mergerFrequencyError],
    [derived.redshift, derived.redshiftError],
    [derived.fit, derived.fitError],
    [derived.plot, derived.plotError],
  ];
  for (const [value, error] of pairs) {
    if (value === null) expect(typeof error).toBe("string");
    else expect(error).toBeNull();
  }
}

describe("computeDerived", () => {
  it("assembles an early-warning neutron-star pair", () => {
    const derived = computeDerived(earlyWarning, { ...defaultPhysicsSettings, chirpModel: "leading-order" }, "N1/ew-1/1");
    expectNullWithReason(derived);
    expect(derived.chirpMass?.detectorFrame.value).toBeDefined();
    const fitted = derived.chirpMass?.detectorFrame;
    if (!fitted) return;
    expect(Math.abs(fitted.value - chirpMass)).toBeLessThan(4 * fitted.sd);
    expect(derived.chirpMass?.sourceFrame?.value).toBeLessThan(fitted.value);
    expect(Math.abs(derived.coalescenceTime ?? Infinity)).toBeLessThan(4 * (derived.coalescenceTimeSd ?? 0));
    // Seconds to merger at receipt is t_c minus the receipt offset, and the client can redo it from eventTime.
    expect(derived.secondsToMerger).toBeCloseTo((derived.coalescenceTime ?? 0) + 28, 12);
    const eventTimeMs = Date.UTC(2031, 4, 6, 12, 0, 0);
    const receiptMs = eventTimeMs - 28_000;
    expect(secondsToMergerAt(derived.coalescenceTime ?? 0, eventTimeMs, receiptMs)).toBeCloseTo(derived.secondsToMerger ?? 0, 9);
    expect(derived.classProbabilities?.bns).toBeGreaterThan(0.99);
    expect(derived.classSampleCount).toBe(20_000);
    expect(derived.redshiftAssumed).toBe(false);
    // z = 0.02 lies at 90 Mpc in Planck 2018 (tests/fixtures/physics/planck18-distances.json, from astropy);
    // the Schwarzschild ISCO is 4.4 kHz (M☉/M) (Maggiore 2008 §4.1), so above 1 kHz for any pair under 4.4 M☉.
    expect(derived.redshift?.value).toBeGreaterThan(0.02);
    expect(derived.mergerFrequency?.iscoHz).toBeGreaterThan(1000);
    expect(derived.mergerFrequency?.finalMass.detectorFrame).toBeLessThan(2.75);
    expect(derived.fit?.samplesUsed).toBe(1_500);
    expect(derived.fit?.residualRmsUnit).toBe("Hz");
  });

  it("keeps plot arrays small and the JSON free of NaN/Infinity", () => {
    const derived = computeDerived(earlyWarning, { ...defaultPhysicsSettings, chirpModel: "leading-order" }, "N1/ew-1/1");
    expect(derived.plot?.kind).toBe("frequency-vs-time");
    if (derived.plot?.kind !== "frequency-vs-time") return;
    expect(derived.plot.curve.tS.length).toBeLessThanOrEqual(200);
    expect(derived.plot.samples.tS.length).toBe(200);
    expect(derived.plot.samples.residualHz.length).toBe(200);
    expect(nonFinitePaths(derived)).toEqual([]);
    expect(JSON.parse(JSON.stringify(derived))).toEqual(derived);
    expect(JSON.stringify(derived).length).toBeLessThan(20_000);
  });

  it("is deterministic for a seed", () => {
    const borderline = { ...earlyWarning, masses: { m1: { mean: 4, sd: 1.5 }, m2: { mean: 2.5, sd: 0.8 } } };
    expect(computeDerived(borderline, defaultPhysicsSettings, "S1/x/2")).toEqual(computeDerived(borderline, defaultPhysicsSettings, "S1/x/2"));
  });

  it("says z = 0 was assumed when no distance is given", () => {
    const { distanceMpc: _omit, ...withoutDistance } = earlyWarning;
    const derived = computeDerived(withoutDistance, defaultPhysicsSettings, "seed");
    expect(derived.redshiftAssumed).toBe(true);
    expect(derived.redshift).toEqual({ value: 0, sd: 0 });
    expect(derived.chirpMass?.sourceFrame).not.toBeNull();
    expect(derived.chirpMass?.sourceFrame?.value).toBe(derived.chirpMass?.detectorFrame.value);
  });

  it("fails block by block: a bad track keeps the classes, a bad distance keeps the fit", () => {
    const badTrack = computeDerived({ ...earlyWarning, frequencyTrack: { t: [0, 1], f: [30, 31] } }, defaultPhysicsSettings, "s");
    expectNullWithReason(badTrack);
    expect(badTrack.chirpMassError).toMatch(/^too-few-samples/);
    expect(badTrack.classProbabilities).not.toBeNull();
    const badDistance = computeDerived({ ...earlyWarning, distanceMpc: { mean: -3, sd: 1 } }, defaultPhysicsSettings, "s");
    expectNullWithReason(badDistance);
    expect(badDistance.redshiftError).toMatch(/^invalid-distance/);
    expect(badDistance.chirpMass?.sourceFrame).toBeNull();
    expect(badDistance.chirpMass?.sourceFrameError).toMatch(/^invalid-distance/);
    expect(badDistance.classProbabilities).toBeNull();
    expect(badDistance.coalescenceTime).not.toBeNull();
    const badSettings = computeDerived(earlyWarning, { ...defaultPhysicsSettings, sampleCount: -1 }, "s");
    expect(badSettings.classProbabilitiesError).toMatch(/^invalid-settings/);
    expect(badSettings.chirpMass).not.toBeNull();
  });

  it("never throws and never emits a non-finite number for any input of finite numbers (fast-check)", () => {
    const finite = fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 });
    const gaussian = fc.record({ mean: finite, sd: finite });
    const timeTrack = fc.record({ t: fc.array(finite, { maxLength: 20 }), f: fc.array(finite, { maxLength: 20 }) });
    const input = fc.record(
      {
        frequencyTrack: timeTrack,
        masses: fc.record({ m1: gaussian, m2: gaussian }),
        spins: fc.record({ chi1: finite, chi2: finite }),
        distanceMpc: gaussian,
        secondsSinceEventTimeAtReceipt: finite,
      },
      { requiredKeys: ["frequencyTrack", "masses", "secondsSinceEventTimeAtReceipt"] },
    );
    fc.assert(
      fc.property(input, fc.string(), (value, seed) => {
        const derived = computeDerived(value, { ...defaultPhysicsSettings, sampleCount: 200 }, seed);
        expectNullWithReason(derived);
        expect(nonFinitePaths(derived)).toEqual([]);
      }),
      { numRuns: 300 },
    );
  });
});
