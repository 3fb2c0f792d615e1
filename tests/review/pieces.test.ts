import { describe, expect, it } from "vitest";
import { settingSchemas } from "@/lib/data/settings";
import { csvField } from "@/lib/review/csv";
import { formatDurationMs } from "@/lib/review/format";
import { binKeyOf, histogramOf } from "@/lib/review/histogram";
import { dayInZone, resolveRange } from "@/lib/review/range";
import type { StepTiming } from "@/lib/review/timeline";
import { weekStarts, weeklyTrend } from "@/lib/review/trend";
import { deadlinesSchema } from "@/lib/validations/review";

const t = (status: StepTiming["status"], durationMs: number | null): StepTiming => ({
  step: "decide",
  status,
  startMs: 0,
  endMs: null,
  durationMs,
  actorId: null,
  note: null,
  overDeadline: false,
});

describe("histogram bins tied to the deadline", () => {
  const deadline = 600_000; // 10 min: edges 0, 2.5, 5, 7.5, 10, 15, 20, 40 min
  it("puts a duration equal to the deadline on the on-time side, and one millisecond more on the late side", () => {
    expect(binKeyOf(t("done", 600_000), deadline)).toBe("b3");
    expect(binKeyOf(t("done", 600_001), deadline)).toBe("b4");
    expect(binKeyOf(t("done", 0), deadline)).toBe("b0");
    expect(binKeyOf(t("done", -1), deadline)).toBe("before");
    expect(binKeyOf(t("done", 10 * 3_600_000), deadline)).toBe("b7");
    expect(binKeyOf(t("open", 5), deadline)).toBe("open");
    expect(binKeyOf(t("waiting", null), deadline)).toBeNull();
  });

  it("labels bins in people's units and omits the pre-merger bin when nothing is there", () => {
    const bins = histogramOf([t("done", 61_000), t("open", 1)], deadline);
    expect(bins.map((b) => b.label)).toEqual(["≤ 2 min 30 s", "2 min 30 s – 5 min", "5 min – 7 min 30 s", "7 min 30 s – 10 min", "10 min – 15 min", "15 min – 20 min", "20 min – 40 min", "> 40 min", "still open"]);
    expect(bins.map((b) => b.count)).toEqual([1, 0, 0, 0, 0, 0, 0, 0, 1]);
    expect(bins.filter((b) => b.late).map((b) => b.key)).toEqual(["b4", "b5", "b6", "b7"]);
  });
});

describe("weeks in the viewer's zone", () => {
  it("starts weeks on Monday midnight local time, across a daylight-saving change", () => {
    // America/Chicago moves to CDT on Sunday 2026-03-08: Monday midnight is 06:00 UTC before, 05:00 UTC after.
    const weeks = weekStarts(Date.UTC(2026, 2, 3), Date.UTC(2026, 2, 12), "America/Chicago").map((ms) => new Date(ms).toISOString());
    expect(weeks).toEqual(["2026-03-02T06:00:00.000Z", "2026-03-09T05:00:00.000Z"]);
  });

  it("gives an empty or inverted range no weeks", () => {
    expect(weeklyTrend([], 10, 10, "UTC")).toEqual([]);
  });
});

describe("resolveRange", () => {
  const now = Date.UTC(2026, 2, 10, 15, 0); // Tuesday 15:00 UTC
  it("reads days as the viewer's local midnights, the end day inclusive", () => {
    expect(resolveRange({ from: "2026-03-01", to: "2026-03-02" }, "Europe/Berlin", now)).toEqual({
      fromMs: Date.UTC(2026, 1, 28, 23, 0),
      toMs: Date.UTC(2026, 2, 2, 23, 0),
    });
  });

  it("defaults to the 28 days ending at the end of today", () => {
    const r = resolveRange({}, "UTC", now);
    expect(r).toEqual({ fromMs: Date.UTC(2026, 1, 11), toMs: Date.UTC(2026, 2, 11) });
  });

  it("refuses inverted and endless ranges with a message", () => {
    expect(resolveRange({ from: "2026-03-05", to: "2026-03-01" }, "UTC", now)).toEqual({ error: "from must be before to" });
    expect(resolveRange({ from: "2010-01-01", to: "2026-01-01" }, "UTC", now)).toHaveProperty("error");
  });

  it("names the local day of an instant", () => {
    expect(dayInZone(Date.UTC(2026, 2, 1, 23, 30), "Europe/Berlin")).toBe("2026-03-02");
  });
});

describe("csvField (RFC 4180)", () => {
  it("quotes commas, quotes and line breaks, and defuses spreadsheet formulas", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField('a,"b"')).toBe('"a,""b"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvField("=HYPERLINK(1)")).toBe("'=HYPERLINK(1)");
    expect(csvField(-12.5)).toBe("-12.5");
    expect(csvField(null)).toBe("");
  });
});

describe("formatDurationMs", () => {
  it("speaks in seconds, minutes, hours and days", () => {
    expect([450, 42_000, 185_000, 3_600_000, 7_830_000, 3 * 86_400_000 + 4 * 3_600_000, -30_000, null].map((ms) => formatDurationMs(ms))).toEqual([
      "0.5 s",
      "42 s",
      "3 min 05 s",
      "1 h",
      "2 h 10 min",
      "3 d 4 h",
      "−30 s",
      "—",
    ]);
  });
});

describe("the deadline form's schema agrees with the stored setting's bounds", () => {
  const stored = settingSchemas.deadlines;
  const full = stored.parse({});
  it("accepts the defaults", () => {
    expect(deadlinesSchema.safeParse(full).success).toBe(true);
  });

  it("accepts and refuses the same values at every bound", () => {
    for (const key of Object.keys(full) as Array<keyof typeof full>) {
      for (const value of [0, 0.05, 0.1, 0.5, 1, 60, 60.5, 240, 241, 1440, 1441, 10080, 10081]) {
        // keep the rule "warning ≤ acknowledgement deadline (paging + acknowledgement)" out of this comparison
        const others = key === "acknowledgeWarnMinutes" ? { acknowledgeStepMinutes: 240 } : { acknowledgeWarnMinutes: 0.5 };
        const candidate = { ...full, ...others, [key]: value };
        const a = stored.safeParse(candidate).success;
        const b = deadlinesSchema.safeParse(candidate).success;
        expect([key, value, b]).toEqual([key, value, a]);
      }
    }
  });
});
