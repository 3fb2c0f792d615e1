import { describe, expect, it } from "vitest";
import { diffAgainstPreferred, signed } from "@/lib/triggers/diff";

const preferred = { eventTimeMs: 10_000, networkSnr: 12, falseAlarmRatePerYear: 0.002, chirpMassDetectorFrame: 1.2, detectors: ["N1", "S1"] };

describe("a trigger against the preferred one", () => {
  it("gives time offset, SNR difference, false-alarm-rate factor, chirp-mass difference and detector sets", () => {
    const d = diffAgainstPreferred({ eventTimeMs: 9_750, networkSnr: 10.5, falseAlarmRatePerYear: 0.02, chirpMassDetectorFrame: 1.25, detectors: ["N1", "W1"] }, preferred);
    expect(d.eventTimeOffsetMs).toBe(-250);
    expect(d.networkSnrDelta).toBeCloseTo(-1.5, 12);
    expect(d.falseAlarmRateRatio).toBeCloseTo(10, 12);
    expect(d.chirpMassDetectorFrameDelta).toBeCloseTo(0.05, 12);
    expect(d.detectorsOnlyHere).toEqual(["W1"]);
    expect(d.detectorsMissingHere).toEqual(["S1"]);
  });

  it("is all zeros against itself, and null where a number is missing or a ratio undefined", () => {
    expect(diffAgainstPreferred(preferred, preferred)).toEqual({
      eventTimeOffsetMs: 0,
      networkSnrDelta: 0,
      falseAlarmRateRatio: 1,
      chirpMassDetectorFrameDelta: 0,
      detectorsOnlyHere: [],
      detectorsMissingHere: [],
    });
    const d = diffAgainstPreferred({ ...preferred, chirpMassDetectorFrame: null }, { ...preferred, falseAlarmRatePerYear: 0 });
    expect(d.chirpMassDetectorFrameDelta).toBeNull();
    expect(d.falseAlarmRateRatio).toBeNull();
  });

  it("writes signed differences with a true minus sign and an unsigned zero", () => {
    expect(signed(0.25, 2)).toBe("+0.25");
    expect(signed(-1.26, 1)).toBe("−1.3");
    expect(signed(-0.001, 2)).toBe("0");
  });
});
