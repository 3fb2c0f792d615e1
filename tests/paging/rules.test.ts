// Pure parts of paging: the policy, local-time windows, backoff, rota coverage, form time zones, link tokens.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { parseAckToken, signAckToken } from "@/lib/notify/ack-links";
import { retryDelayMs } from "@/lib/notify/backoff";
import { formatFalseAlarmRate } from "@/lib/notify/content";
import { muteReason } from "@/lib/notify/deliver";
import { isWithinLocalWindow, localMinuteOfDay } from "@/lib/notify/local-time";
import { planPaging } from "@/lib/notify/policy";
import { defaultPreferences } from "@/lib/notify/preferences";
import { findRotaIssues } from "@/lib/notify/rota-coverage";
import { instantToLocalInput, localInputToInstant } from "@/lib/notify/rota-form";
import { escalationPolicySchema } from "@/lib/validations/paging";

const policy = escalationPolicySchema.parse({});
const at = (iso: string) => new Date(iso);

describe("the escalation policy", () => {
  const base = { stage: "first-look", falseAlarmRatePerYear: 0.5, primaryTimeZone: "Europe/Berlin" };

  it("by default pages the primary at once, the backup after 5 min and the coordinators 5 min later", () => {
    const receivedAt = at("2031-03-04T12:00:00Z");
    const plan = planPaging(policy, { ...base, receivedAt, now: receivedAt });
    expect(plan.action).toBe("page");
    expect(plan.steps.map((s) => [s.target, s.dueAt.toISOString()])).toEqual([
      ["primary", "2031-03-04T12:00:00.000Z"],
      ["backup", "2031-03-04T12:05:00.000Z"],
      ["coordinators", "2031-03-04T12:10:00.000Z"],
    ]);
  });

  it("pages nobody for a withdrawn candidate", () => {
    const receivedAt = at("2031-03-04T12:00:00Z");
    expect(planPaging(policy, { ...base, stage: "withdrawn", receivedAt, now: receivedAt })).toMatchObject({ action: "none", steps: [] });
  });

  it("keeps a low-significance candidate in the app at night in the primary's zone, and pages by day", () => {
    // 23:30 in Berlin (UTC+1 in March 2031 before the change) is night; 12:00 is not.
    const night = at("2031-03-04T22:30:00Z");
    const day = at("2031-03-04T11:00:00Z");
    const noisy = { ...base, falseAlarmRatePerYear: 50 };
    expect(planPaging(policy, { ...noisy, receivedAt: night, now: night }).action).toBe("in-app-only");
    expect(planPaging(policy, { ...noisy, receivedAt: day, now: day }).action).toBe("page");
    expect(planPaging(policy, { ...base, receivedAt: night, now: night }).action).toBe("page");
    // The same instant is 16:30 in Chicago: daytime there, so the primary is paged.
    expect(planPaging(policy, { ...noisy, primaryTimeZone: "America/Chicago", receivedAt: night, now: night }).action).toBe("page");
  });

  it("pages nobody about a candidate received longer ago than maxAgeMinutes (a replay)", () => {
    const receivedAt = at("2031-03-04T12:00:00Z");
    expect(planPaging(policy, { ...base, receivedAt, now: at("2031-03-04T13:00:01Z") }).action).toBe("none");
    expect(planPaging(policy, { ...base, receivedAt, now: at("2031-03-04T12:59:00Z") }).action).toBe("page");
  });
});

describe("local-time windows", () => {
  it("reads wall-clock minutes in a zone, across a daylight-saving change", () => {
    // 2031-03-30 01:00Z is 03:00 CEST in Berlin (clocks went forward at 01:00Z that day).
    expect(localMinuteOfDay(at("2031-03-30T00:59:00Z"), "Europe/Berlin")).toBe(1 * 60 + 59);
    expect(localMinuteOfDay(at("2031-03-30T01:00:00Z"), "Europe/Berlin")).toBe(3 * 60);
    expect(localMinuteOfDay(at("2031-03-30T01:00:00Z"), "Not/AZone")).toBe(60);
  });

  it("treats a window that ends before it starts as running over midnight", () => {
    expect(isWithinLocalWindow(at("2031-01-01T23:30:00Z"), "UTC", "22:00", "07:00")).toBe(true);
    expect(isWithinLocalWindow(at("2031-01-01T06:59:00Z"), "UTC", "22:00", "07:00")).toBe(true);
    expect(isWithinLocalWindow(at("2031-01-01T07:00:00Z"), "UTC", "22:00", "07:00")).toBe(false);
    expect(isWithinLocalWindow(at("2031-01-01T12:00:00Z"), "UTC", "09:00", "17:00")).toBe(true);
    expect(isWithinLocalWindow(at("2031-01-01T17:00:00Z"), "UTC", "09:00", "17:00")).toBe(false);
  });

  it("holds back push and e-mail in quiet hours and when switched off, task switches for task messages", () => {
    const prefs = { ...defaultPreferences(), quietStart: "22:00", quietEnd: "07:00" };
    const night = at("2031-01-01T23:00:00Z");
    const noon = at("2031-01-01T12:00:00Z");
    expect(muteReason({ kind: "page", channel: "push" }, prefs, "UTC", night)).toMatch(/quiet hours/);
    expect(muteReason({ kind: "page", channel: "push" }, prefs, "UTC", noon)).toBeNull();
    expect(muteReason({ kind: "page", channel: "email" }, { ...prefs, email: false }, "UTC", noon)).toMatch(/switched off/);
    const tasks = { ...prefs, taskChannels: { push: false, email: true } };
    expect(muteReason({ kind: "task-created", channel: "push" }, tasks, "UTC", noon)).toMatch(/switched off/);
    expect(muteReason({ kind: "page", channel: "push" }, tasks, "UTC", noon)).toBeNull();
  });
});

describe("retry backoff with full jitter", () => {
  it("stays within [0, min(cap, base·2^(n−1))) for every attempt and random draw", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 60 }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (attempt, r) => {
        const ceiling = Math.min(600_000, 5_000 * 2 ** (attempt - 1));
        const delay = retryDelayMs(attempt, r);
        return delay >= 0 && delay < ceiling;
      }),
    );
    expect(retryDelayMs(1, 0.5)).toBe(2_500);
    expect(retryDelayMs(4, 0.5)).toBe(20_000);
    expect(retryDelayMs(20, 0.5)).toBe(300_000);
  });
});

describe("rota coverage", () => {
  const h = (hours: number) => hours * 3_600_000;

  it("names overlaps and the stretches nobody covers", () => {
    const issues = findRotaIssues(
      [
        { id: "a", startsAt: h(0), endsAt: h(8) },
        { id: "b", startsAt: h(6), endsAt: h(12) },
        { id: "c", startsAt: h(14), endsAt: h(30) },
      ],
      h(-2),
      h(24),
    );
    expect(issues).toEqual([
      { kind: "gap", from: h(-2), to: h(0) },
      { kind: "overlap", shiftIds: ["a", "b"], from: h(6), to: h(8) },
      { kind: "gap", from: h(12), to: h(14) },
    ]);
  });

  it("finds no gap exactly when the shifts cover the whole range (checked against a minute-by-minute scan)", () => {
    const span = fc.tuple(fc.integer({ min: 0, max: 47 }), fc.integer({ min: 1, max: 12 }));
    fc.assert(
      fc.property(fc.array(span, { maxLength: 6 }), (spans) => {
        const shifts = spans.map(([s, len], i) => ({ id: String(i), startsAt: h(s), endsAt: h(s + len) }));
        const gaps = findRotaIssues(shifts, 0, h(48)).filter((i) => i.kind === "gap");
        let uncoveredHours = 0;
        for (let hour = 0; hour < 48; hour++) {
          if (!shifts.some((x) => x.startsAt <= h(hour) && x.endsAt > h(hour))) uncoveredHours += 1;
        }
        const gapHours = gaps.reduce((sum, g) => sum + (g.to - g.from) / h(1), 0);
        return gapHours === uncoveredHours;
      }),
    );
  });
});

describe("rota form times", () => {
  it("reads a datetime-local value in the viewer's zone and writes it back", () => {
    expect(localInputToInstant("2031-07-01T09:00", "America/Santiago").toISOString()).toBe("2031-07-01T13:00:00.000Z");
    expect(localInputToInstant("2031-07-01T09:00", "Europe/Berlin").toISOString()).toBe("2031-07-01T07:00:00.000Z");
    expect(instantToLocalInput(at("2031-07-01T07:00:00Z"), "Europe/Berlin")).toBe("2031-07-01T09:00");
    expect(instantToLocalInput(at("2031-01-01T23:30:00Z"), "Australia/Perth")).toBe("2031-01-02T07:30");
  });
});

describe("acknowledge tokens", () => {
  const claims = { id: "6f1d3c5e-2b7a-4c1e-9d3f-0a1b2c3d4e5f", candidateId: "c1", userId: "u1", expiresAtMs: 1_930_000_000_000 };

  it("round-trip the id and expiry, and the signature covers candidate and user", () => {
    const token = signAckToken(claims, "s".repeat(32));
    expect(parseAckToken(token)).toMatchObject({ id: claims.id, expiresAtMs: claims.expiresAtMs });
    expect(signAckToken({ ...claims, userId: "u2" }, "s".repeat(32))).not.toBe(token);
    expect(signAckToken({ ...claims, candidateId: "c2" }, "s".repeat(32))).not.toBe(token);
    expect(signAckToken(claims, "t".repeat(32))).not.toBe(token);
    expect(parseAckToken(`${token}x`)).toBeNull();
  });
});

describe("message text", () => {
  it("writes false-alarm rates for a pager", () => {
    expect(formatFalseAlarmRate(0.01)).toBe("1 per 100 yr");
    expect(formatFalseAlarmRate(0.3)).toBe("1 per 3.3 yr");
    expect(formatFalseAlarmRate(12)).toBe("12.0 per yr");
    expect(formatFalseAlarmRate(0)).toBe("no false alarms expected");
  });
});

describe("rota week view", () => {
  it("starts weeks on Monday in the viewer's zone and keeps 23-hour days when clocks go forward", async () => {
    const { weekDays, weekStartMs, layoutDay } = await import("@/lib/notify/rota-week");
    // Sunday 2031-03-30 22:30 UTC is already Monday 00:30 in Berlin (CEST, UTC+2).
    const start = weekStartMs(Date.parse("2031-03-30T22:30:00Z"), "Europe/Berlin");
    expect(new Date(start).toISOString()).toBe("2031-03-30T22:00:00.000Z");
    const previous = weekDays(weekStartMs(Date.parse("2031-03-27T12:00:00Z"), "Europe/Berlin"), "Europe/Berlin");
    const sunday = previous[6];
    expect(sunday?.key).toBe("2031-03-30");
    expect(((sunday?.endMs ?? 0) - (sunday?.startMs ?? 0)) / 3_600_000).toBe(23);
    const day = { key: "d", label: "d", startMs: 0, endMs: 24 * 3_600_000 };
    const laid = layoutDay(
      [
        { startMs: -3_600_000, endMs: 8 * 3_600_000 },
        { startMs: 6 * 3_600_000, endMs: 12 * 3_600_000 },
      ],
      day,
    );
    expect(laid.map((s) => [s.lane, s.topFraction, s.continuesBefore])).toEqual([
      [0, 0, true],
      [1, 0.25, false],
    ]);
  });
});
