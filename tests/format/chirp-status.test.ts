import { describe, expect, it } from "vitest";
import { chirpStatus, chirpStatusSentence, chirpStatusShort } from "@/lib/format/chirp-status";
import { chirpMassFromComponents, computeDerived, defaultPhysicsSettings, type TriggerPhysicsInput } from "@/lib/physics";
import { syntheticTimeTrack } from "../physics/track-helpers";

const masses = { m1: { mean: 1.45, sd: 0.1 }, m2: { mean: 1.3, sd: 0.1 } };
const chirp = syntheticTimeTrack({ chirpMass: chirpMassFromComponents(1.45, 1.3), tcS: 0, startS: -60, endS: -2, samples: 400, relativeNoise: 0.004, seed: "status" });

/** The status the card and page would show for a trigger with this track, computed end to end. */
function statusFor(frequencyTrack: unknown) {
  const input = { frequencyTrack, masses, secondsSinceEventTimeAtReceipt: 0 } as TriggerPhysicsInput;
  const d = computeDerived(input, defaultPhysicsSettings, "status");
  return chirpStatus({ fitted: d.chirpMass !== null, chirpMassError: d.chirpMassError, model: d.fit?.model, reducedChiSquare: d.fit?.reducedChiSquare });
}

describe("chirp status in plain words", () => {
  it("a clean chirp is fitted, names the 3.5PN model and is not a poor fit", () => {
    const status = statusFor(chirp);
    expect(status).toEqual({ kind: "fitted", model: "pn-3.5", poorFit: null });
    expect(chirpStatusShort(status)).toBe("3.5PN frequency evolution");
    expect(chirpStatusSentence(status)).toBeNull();
  });

  it.each([
    ["empty", { t: [], f: [] }],
    ["one sample", { t: [0], f: [100] }],
    ["zero frequency", { t: [0, 1, 2, 3], f: [30, 0, 40, 50] }],
    ["negative frequency", { t: [0, 1, 2, 3], f: [30, -35, 40, 50] }],
    ["times in milliseconds", { t: chirp.t.map((t) => t * 1000 - 1e5), f: chirp.f }],
  ])("a degenerate track (%s) says plainly that it was unusable", (_name, track) => {
    const status = statusFor(track);
    expect(status.kind).toBe("unusable");
    expect(chirpStatusShort(status)).toBe("track unusable: no chirp mass");
    expect(chirpStatusSentence(status)).toMatch(/^The frequency track was unusable, so no chirp mass/);
  });

  it("a constant tone is not chirp-like", () => {
    const tone = { t: chirp.t, f: chirp.t.map((_t, i) => 120 + 0.5 * Math.sin(i * 1.7)) };
    const status = statusFor(tone);
    expect(status.kind).toBe("not-chirp-like");
    expect(chirpStatusShort(status)).toBe("track not chirp-like: no chirp mass");
  });

  it("a falling track (a tail after merger) is not chirp-like", () => {
    const falling = { t: chirp.t, f: [...chirp.f].reverse() };
    expect(statusFor(falling).kind).toBe("not-chirp-like");
  });

  it("a missing track is 'not fitted' with the reason, not 'unusable'", () => {
    const status = statusFor(undefined);
    expect(status).toEqual({ kind: "not-fitted", detail: "the trigger carried no frequency track" });
  });

  it("a reduced χ² above 3 is flagged as a poor fit, at or below it is not", () => {
    const at = (chi: number) => chirpStatus({ fitted: true, chirpMassError: null, model: "leading-order", reducedChiSquare: chi });
    expect(at(3)).toEqual({ kind: "fitted", model: "leading-order", poorFit: null });
    const poor = at(7.25);
    expect(poor.kind === "fitted" && poor.poorFit).toMatch(/poor fit: residuals 7\.3× /);
    expect(chirpStatusShort(poor)).toBe("poor fit");
  });
});
