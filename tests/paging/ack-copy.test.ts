import { describe, expect, it } from "vitest";
import { acknowledgedText } from "@/lib/notify/ack-copy";

const candidate = {
  id: "c1",
  externalId: "trg-0mx5x0000-01",
  source: "pipeline-alpha",
  stage: "first-look" as const,
  networkSnr: 11.8,
  falseAlarmRatePerYear: 0.02,
  dominantClass: "bns" as const,
  detectors: ["N1", "S1"],
  triageState: "acknowledged",
};
const base = {
  state: "done" as const,
  candidate,
  userName: "Ada Quill",
  timeZone: "UTC",
  acknowledgedBy: "Ada Quill",
  acknowledgedAt: "2026-12-02T03:04:05.000Z",
  expiresAt: "2026-12-02T05:00:00.000Z",
};

describe("what the acknowledge page says afterwards", () => {
  it("tells the person who pressed that escalation stopped, in one sentence order", () => {
    expect(acknowledgedText(base)).toBe("Acknowledged by Ada Quill at 2026-12-02 03:04:05\u00a0UTC. Escalation stopped.");
  });

  it("tells anyone else who was first, and where the candidate went, by its column name", () => {
    expect(acknowledgedText({ ...base, state: "already", userName: "Emil Varga", candidate: { ...candidate, triageState: "reviewing" } })).toBe(
      "Already acknowledged by Ada Quill at 2026-12-02 03:04:05\u00a0UTC. It is now in “In review”.",
    );
    expect(acknowledgedText({ ...base, state: "already", acknowledgedBy: null, acknowledgedAt: null })).toBe("Already acknowledged.");
  });
});
