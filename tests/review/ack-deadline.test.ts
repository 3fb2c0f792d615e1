import { describe, expect, it } from "vitest";
import { settingSchemas } from "@/lib/data/settings";
import { isAcknowledgementLate } from "@/lib/review/evaluate";
import { stepDeadlinesMs } from "@/lib/review/steps";
import { ackLevel } from "@/lib/triage/ack-level";
import { acknowledgeDeadlineMinutes, boardAckDeadlines } from "@/lib/validations/review";

// Defaults of the stored setting: paging 1 min, acknowledgement step 4 min, board warning at 3 min.
const defaults = settingSchemas.deadlines.parse({});
const deadlinesMs = stepDeadlinesMs(defaults);
const RECEIPT = 1_000_000;

/** An acknowledgement step that started with the first page at `pageS` and ended at `ackS` (seconds after receipt). */
const acked = (pageS: number, ackS: number) => ({ status: "done" as const, startMs: RECEIPT + pageS * 1000, durationMs: (ackS - pageS) * 1000 });

describe("one acknowledgement deadline for the board, the review and paging", () => {
  it("is paging + acknowledgement step from receipt: 1 + 4 = 5 min by default, following both settings", () => {
    expect(acknowledgeDeadlineMinutes(defaults)).toBe(5);
    expect(acknowledgeDeadlineMinutes({ ...defaults, pageMinutes: 2, acknowledgeStepMinutes: 0.5 })).toBe(2.5);
    expect(boardAckDeadlines(defaults)).toEqual({ acknowledgeWarnMinutes: 3, acknowledgeAlarmMinutes: 5 });
    // the warning never comes after the deadline
    expect(boardAckDeadlines({ ...defaults, acknowledgeStepMinutes: 1 })).toEqual({ acknowledgeWarnMinutes: 2, acknowledgeAlarmMinutes: 2 });
  });

  it("an acknowledgement 4 min 54 s after receipt is on time for the review and 'Acknowledge soon' on the board", () => {
    // page at +5 s: the step alone took 4 min 49 s, more than its 4 min, yet the candidate met the 5 min deadline
    expect(isAcknowledgementLate(acked(5, 294), RECEIPT, deadlinesMs)).toBe(false);
    expect(ackLevel(294, boardAckDeadlines(defaults))).toBe("warn");
  });

  it("one second past 5 min is late in the review and 'Overdue' on the board, however quick the page was", () => {
    expect(isAcknowledgementLate(acked(5, 301), RECEIPT, deadlinesMs)).toBe(true);
    expect(ackLevel(301, boardAckDeadlines(defaults))).toBe("alarm");
    expect(ackLevel(300, boardAckDeadlines(defaults))).toBe("alarm");
    expect(isAcknowledgementLate(acked(5, 300), RECEIPT, deadlinesMs)).toBe(false); // exactly at it: not yet past
  });

  it("a slow page does not make a prompt acknowledgement late: page at +90 s, acknowledged at +280 s", () => {
    expect(isAcknowledgementLate(acked(90, 280), RECEIPT, deadlinesMs)).toBe(false);
  });

  it("an open acknowledgement is late once now is past the deadline; waiting and skipped steps never are", () => {
    expect(isAcknowledgementLate({ status: "open", startMs: RECEIPT + 10_000, durationMs: 291_000 }, RECEIPT, deadlinesMs)).toBe(true);
    expect(isAcknowledgementLate({ status: "open", startMs: RECEIPT + 10_000, durationMs: 280_000 }, RECEIPT, deadlinesMs)).toBe(false);
    expect(isAcknowledgementLate({ status: "waiting", startMs: null, durationMs: null }, RECEIPT, deadlinesMs)).toBe(false);
    expect(isAcknowledgementLate({ status: "skipped", startMs: RECEIPT, durationMs: 900_000 }, RECEIPT, deadlinesMs)).toBe(false);
  });
});
