import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatAge, formatCountdown, formatDuration } from "@/lib/format/duration";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { formatPercent } from "@/lib/format/numbers";
import { formatInZone } from "@/lib/format/time";
import { formatWithUncertainty } from "@/lib/format/uncertainty";

describe("false-alarm rate in a human unit", () => {
  it("reads rates below one a year as 1 per N years", () => {
    expect(formatFalseAlarmRate(0.02)).toBe("1 per 50 years");
    expect(formatFalseAlarmRate(1 / 3)).toBe("1 per 3 years");
    expect(formatFalseAlarmRate(3e-5)).toBe("1 per 33,000 years");
    expect(formatFalseAlarmRate(2e-7)).toBe("1 per 5 million years");
    expect(formatFalseAlarmRate(1e-6)).toBe("1 per 1 million years");
    expect(formatFalseAlarmRate(0.999)).toBe("1 per year");
  });

  it("reads 1 to 12 a year as N per year", () => {
    expect(formatFalseAlarmRate(1)).toBe("1 per year");
    expect(formatFalseAlarmRate(4)).toBe("4 per year");
    expect(formatFalseAlarmRate(1.46)).toBe("1.5 per year");
  });

  it("reads more frequent rates as 1 per N days, then N per day", () => {
    expect(formatFalseAlarmRate(36.525)).toBe("1 per 10 days");
    expect(formatFalseAlarmRate(365.25)).toBe("1 per day");
    expect(formatFalseAlarmRate(365.25 * 4)).toBe("4 per day");
  });

  it("says so for zero and for nonsense", () => {
    expect(formatFalseAlarmRate(0)).toBe("none expected");
    expect(formatFalseAlarmRate(-1)).toBe("unknown");
    expect(formatFalseAlarmRate(Number.NaN)).toBe("unknown");
  });

  it("keeps N within 5 % of the reciprocal rate for any rate below one a year", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-8, max: 0.9, noNaN: true }), (rate) => {
        const text = formatFalseAlarmRate(rate);
        const match = /^1 per ([\d,.]+)( million| billion)? years?$/.exec(text);
        expect(match, text).not.toBeNull();
        const scale = match?.[2] === " million" ? 1e6 : match?.[2] === " billion" ? 1e9 : 1;
        const years = Number((match?.[1] ?? "").replaceAll(",", "")) * scale;
        expect(Math.abs(years * rate - 1)).toBeLessThan(0.05);
      }),
    );
  });
});

describe("durations", () => {
  it("uses at most two units, rounded down", () => {
    expect(formatDuration(0)).toBe("0 s");
    expect(formatDuration(45.9)).toBe("45 s");
    expect(formatDuration(125)).toBe("2 min 05 s");
    expect(formatDuration(3725)).toBe("1 h 02 min");
    expect(formatDuration(90_061)).toBe("1 d 01 h");
    expect(formatDuration(-125)).toBe("2 min 05 s");
  });

  it("counts down to merger and then up from it", () => {
    expect(formatCountdown(65)).toBe("merger in 1 min 05 s");
    expect(formatCountdown(-30)).toBe("merged 30 s ago");
  });

  it("gives coarse ages", () => {
    expect(formatAge(3)).toBe("just now");
    expect(formatAge(42)).toBe("42 s ago");
    expect(formatAge(7200)).toBe("2 h ago");
  });
});

describe("values with uncertainty", () => {
  it("keeps two significant figures of the uncertainty and matches the value's decimals", () => {
    expect(formatWithUncertainty(1.18763, 0.00412, "M☉")).toBe("1.1876 ± 0.0041 M☉");
    expect(formatWithUncertainty(28.349, 1.26)).toBe("28.3 ± 1.3");
    expect(formatWithUncertainty(1234.5, 123)).toBe("1230 ± 120");
  });

  it("shows four significant figures when the uncertainty is missing", () => {
    expect(formatWithUncertainty(1.187634, null, "M☉")).toBe("1.188 M☉");
    expect(formatWithUncertainty(Number.NaN, 1)).toBe("—");
  });
});

describe("percent and zoned times", () => {
  it("formats percentages for labels", () => {
    expect(formatPercent(0.973)).toBe("97 %");
    expect(formatPercent(0.004)).toBe("0.4 %");
    expect(formatPercent(0.0004)).toBe("< 0.1 %");
  });

  it("names the zone and shifts the clock", () => {
    const instant = Date.UTC(2025, 0, 15, 12, 0, 0);
    expect(formatInZone(instant, "UTC")).toBe("2025-01-15 12:00:00 UTC");
    expect(formatInZone(instant, "Europe/Berlin")).toBe("2025-01-15 13:00:00 GMT+1");
    expect(formatInZone(instant, "Not/AZone")).toBe("2025-01-15 12:00:00 UTC");
  });
});

describe("clock times", () => {
  it("shows hours and minutes with the zone, across a date line", async () => {
    const { formatClock } = await import("@/lib/format/time");
    const instant = Date.UTC(2025, 6, 1, 23, 30, 0);
    expect(formatClock(instant, "UTC")).toBe("23:30 UTC");
    // Perth is UTC+8 all year (no daylight saving), so 23:30 UTC is 07:30 the next morning.
    expect(formatInZone(instant, "Australia/Perth")).toBe("2025-07-02 07:30:00 GMT+8");
  });
});

describe("observing windows", () => {
  it("dates the end only when it falls on another local day than the start", async () => {
    const { formatWindow } = await import("@/lib/format/time");
    const start = Date.UTC(2026, 10, 30, 10, 21);
    // Santiago keeps daylight-saving time, UTC−3, in the southern summer (tz database), so 10:21 UTC is 07:21 there.
    expect(formatWindow(start, Date.UTC(2026, 10, 30, 12, 49), "America/Santiago", 2026)).toBe("11-30 07:21 → 09:49 GMT-3");
    expect(formatWindow(start, Date.UTC(2026, 11, 2, 13, 49), "America/Santiago", 2026)).toBe("11-30 07:21 → 12-02 10:49 GMT-3");
    // The same pair of instants seen from Perth (UTC+8) starts at 18:21 and ends at 20:49 on the same day.
    expect(formatWindow(start, Date.UTC(2026, 10, 30, 12, 49), "Australia/Perth", 2026)).toBe("11-30 18:21 → 20:49 GMT+8");
    expect(formatWindow(null, Date.UTC(2026, 11, 2, 13, 49), "UTC", 2026)).toBe("now → 12-02 13:49 UTC");
    expect(formatWindow(start, null, "UTC", 2026)).toBe("11-30 10:21 UTC → open end");
    expect(formatWindow(null, null, "UTC", 2026)).toBeNull();
  });

  it("gives a date its year whenever that is not this year", async () => {
    const { formatWindow, yearInZone } = await import("@/lib/format/time");
    const start = Date.UTC(2026, 11, 31, 20, 0);
    // 20:00 UTC on 31 December is already 05:00 on 1 January 2027 in Tokyo (UTC+9, no daylight saving).
    expect(formatWindow(start, Date.UTC(2026, 11, 31, 22, 0), "UTC", 2026)).toBe("12-31 20:00 → 22:00 UTC");
    expect(formatWindow(start, Date.UTC(2027, 0, 1, 2, 0), "UTC", 2026)).toBe("12-31 20:00 → 2027-01-01 02:00 UTC");
    expect(formatWindow(null, Date.UTC(9999, 11, 31, 12, 0), "UTC", 2026)).toBe("now → 9999-12-31 12:00 UTC");
    expect(formatWindow(start, null, "UTC", 2025)).toBe("2026-12-31 20:00 UTC → open end");
    expect(yearInZone(start, "Asia/Tokyo")).toBe(2027);
    expect(yearInZone(start, "UTC")).toBe(2026);
  });
});
