import { describe, expect, it } from "vitest";
import { secondsToMergerAt } from "@/lib/physics";
import { ackLevel, secondsToMerger } from "@/lib/triage/ack-level";

const deadlines = { acknowledgeWarnMinutes: 3, acknowledgeAlarmMinutes: 5 };

describe("acknowledgement timer levels", () => {
  it("waits, then warns at the warn deadline, then alarms at the alarm deadline (inclusive)", () => {
    expect(ackLevel(0, deadlines)).toBe("waiting");
    expect(ackLevel(179.9, deadlines)).toBe("waiting");
    expect(ackLevel(180, deadlines)).toBe("warn");
    expect(ackLevel(299, deadlines)).toBe("warn");
    expect(ackLevel(300, deadlines)).toBe("alarm");
  });

  it("follows the coordinator's settings", () => {
    expect(ackLevel(90, { acknowledgeWarnMinutes: 1, acknowledgeAlarmMinutes: 2 })).toBe("warn");
  });
});

describe("merger countdown", () => {
  it("agrees with the physics module's secondsToMergerAt", () => {
    const eventTime = Date.UTC(2030, 0, 1, 0, 0, 0);
    for (const [tc, now] of [[12.5, eventTime - 30_000], [0.2, eventTime + 5_000], [-1, eventTime]] as const) {
      expect(secondsToMerger(tc, eventTime, now)).toBeCloseTo(secondsToMergerAt(tc, eventTime, now), 9);
    }
    // 30 s before the event time with the merger fitted 12.5 s after it: 42.5 s to go.
    expect(secondsToMerger(12.5, eventTime, eventTime - 30_000)).toBeCloseTo(42.5, 9);
  });
});
