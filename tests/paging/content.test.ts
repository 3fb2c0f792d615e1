import { describe, expect, it } from "vitest";
import { candidateFacts, candidateTextFor, type CandidateSummary } from "@/lib/notify/content";

const base: CandidateSummary = {
  id: "c1",
  externalId: "trg-demo-01",
  source: "pipeline-alpha",
  stage: "first-look",
  networkSnr: 12.34,
  falseAlarmRatePerYear: 0.01,
  dominantClass: "bns",
  detectors: ["N1", "S1"],
};

describe("what a page says about a candidate", () => {
  it("carries chirp mass, class, distance and sky area when known, marked as rapid estimates", () => {
    const text = candidateFacts({ ...base, chirpMassDetectorFrame: 1.2187, distanceMpc: { mean: 152.4, sd: 40.6 }, area90Deg2: 1359.7 });
    expect(text).toBe(
      "first-look, SNR 12.3, FAR 1 per 100 yr, likely BNS (rapid estimates: chirp mass 1.2 M☉ (detector frame), distance 152 ± 41 Mpc, 90 % sky area 1,360 deg²), seen by N1 S1",
    );
  });

  it("leaves out what is not known yet (no fit, no distance, no map) instead of printing blanks", () => {
    expect(candidateFacts({ ...base, chirpMassDetectorFrame: null, distanceMpc: null, area90Deg2: null })).toBe(
      "first-look, SNR 12.3, FAR 1 per 100 yr, likely BNS, seen by N1 S1",
    );
    expect(candidateFacts({ ...base, dominantClass: null })).toContain("class pending");
  });

  it("puts the same facts in the page and in the escalation", () => {
    const c = { ...base, chirpMassDetectorFrame: 28.5 };
    expect(candidateTextFor(c, { kind: "page", role: "primary" }).body).toContain("chirp mass 28.5 M☉ (detector frame)");
    expect(candidateTextFor(c, { kind: "escalation", role: "backup", minutesUnacknowledged: 5 }).body).toContain("chirp mass 28.5 M☉");
  });
});
