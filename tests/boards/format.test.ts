import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { formatAge, formatCountdown, formatDuration } from "@/lib/format/duration";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { formatPercent } from "@/lib/format/numbers";
import { formatInZone } from "@/lib/format/time";
import { formatWithUncertainty } from "@/lib/format/uncertainty";

/** Expected text with "_" for the no-break space that keeps a number with its unit. */
const nb = (text: string) => text.replaceAll("_", "\u00a0");

describe("false-alarm rate in a human unit", () => {
  it("reads rates below one a year as 1 per N years", () => {
    expect(formatFalseAlarmRate(0.02)).toBe(nb("1 per 50_years"));
    expect(formatFalseAlarmRate(1 / 3)).toBe(nb("1 per 3_years"));
    expect(formatFalseAlarmRate(3e-5)).toBe(nb("1 per 33,000_years"));
    expect(formatFalseAlarmRate(2e-7)).toBe(nb("1 per 5_million_years"));
    expect(formatFalseAlarmRate(1e-6)).toBe(nb("1 per 1_million_years"));
    expect(formatFalseAlarmRate(0.999)).toBe(nb("1_per year"));
  });

  it("reads 1 to 12 a year as N per year", () => {
    expect(formatFalseAlarmRate(1)).toBe(nb("1_per year"));
    expect(formatFalseAlarmRate(4)).toBe(nb("4_per year"));
    expect(formatFalseAlarmRate(1.46)).toBe(nb("1.5_per year"));
  });

  it("reads more frequent rates as 1 per N days, then N per day", () => {
    expect(formatFalseAlarmRate(36.525)).toBe(nb("1 per 10_days"));
    expect(formatFalseAlarmRate(365.25)).toBe(nb("1_per day"));
    expect(formatFalseAlarmRate(365.25 * 4)).toBe(nb("4_per day"));
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
        const match = /^1 per ([\d,.]+)(\u00a0million|\u00a0billion)?\u00a0years$/.exec(text);
        expect(match, text).not.toBeNull();
        const scale = match?.[2] === nb("_million") ? 1e6 : match?.[2] === nb("_billion") ? 1e9 : 1;
        const years = Number((match?.[1] ?? "").replaceAll(",", "")) * scale;
        expect(Math.abs(years * rate - 1)).toBeLessThan(0.05);
      }),
    );
  });
});

describe("durations", () => {
  it("uses at most two units, rounded down", () => {
    expect(formatDuration(0)).toBe(nb("0_s"));
    expect(formatDuration(45.9)).toBe(nb("45_s"));
    expect(formatDuration(125)).toBe(nb("2_min_05_s"));
    expect(formatDuration(3725)).toBe(nb("1_h_02_min"));
    expect(formatDuration(90_061)).toBe(nb("1_d_01_h"));
    expect(formatDuration(-125)).toBe(nb("2_min_05_s"));
  });

  it("counts down to merger and then up from it", () => {
    expect(formatCountdown(65)).toBe(nb("merger in 1_min_05_s"));
    expect(formatCountdown(-30)).toBe(nb("merged 30_s ago"));
  });

  it("gives coarse ages", () => {
    expect(formatAge(3)).toBe("just now");
    expect(formatAge(42)).toBe(nb("42_s ago"));
    expect(formatAge(7200)).toBe(nb("2_h ago"));
  });
});

describe("values with uncertainty", () => {
  it("keeps two significant figures of the uncertainty and matches the value's decimals", () => {
    expect(formatWithUncertainty(1.18763, 0.00412, "M☉")).toBe(nb("1.1876_±_0.0041_M☉"));
    expect(formatWithUncertainty(28.349, 1.26)).toBe(nb("28.3_±_1.3"));
    expect(formatWithUncertainty(1234.5, 123)).toBe(nb("1230_±_120"));
  });

  it("shows four significant figures when the uncertainty is missing", () => {
    expect(formatWithUncertainty(1.187634, null, "M☉")).toBe(nb("1.188_M☉"));
    expect(formatWithUncertainty(Number.NaN, 1)).toBe("—");
  });
});

describe("percent and zoned times", () => {
  it("formats percentages for labels", () => {
    expect(formatPercent(0.973)).toBe(nb("97_%"));
    expect(formatPercent(0.004)).toBe(nb("0.4_%"));
    expect(formatPercent(0.0004)).toBe(nb("<_0.1_%"));
  });

  it("names the zone and shifts the clock", () => {
    const instant = Date.UTC(2025, 0, 15, 12, 0, 0);
    expect(formatInZone(instant, "UTC")).toBe(nb("2025-01-15 12:00:00_UTC"));
    expect(formatInZone(instant, "Europe/Berlin")).toBe(nb("2025-01-15 13:00:00_GMT+1"));
    expect(formatInZone(instant, "Not/AZone")).toBe(nb("2025-01-15 12:00:00_UTC"));
  });
});

describe("clock times", () => {
  it("shows hours and minutes with the zone, across a date line", async () => {
    const { formatClock } = await import("@/lib/format/time");
    const instant = Date.UTC(2025, 6, 1, 23, 30, 0);
    expect(formatClock(instant, "UTC")).toBe(nb("23:30_UTC"));
    // Perth is UTC+8 all year (no daylight saving), so 23:30 UTC is 07:30 the next morning.
    expect(formatInZone(instant, "Australia/Perth")).toBe(nb("2025-07-02 07:30:00_GMT+8"));
  });
});

describe("observing windows", () => {
  it("dates the end only when it falls on another local day than the start", async () => {
    const { formatWindow } = await import("@/lib/format/time");
    const start = Date.UTC(2026, 10, 30, 10, 21);
    // Santiago keeps daylight-saving time, UTC−3, in the southern summer (tz database), so 10:21 UTC is 07:21 there.
    expect(formatWindow(start, Date.UTC(2026, 10, 30, 12, 49), "America/Santiago", 2026)).toBe(nb("11-30_07:21 → 09:49_GMT-3"));
    expect(formatWindow(start, Date.UTC(2026, 11, 2, 13, 49), "America/Santiago", 2026)).toBe(nb("11-30_07:21 → 12-02_10:49_GMT-3"));
    // The same pair of instants seen from Perth (UTC+8) starts at 18:21 and ends at 20:49 on the same day.
    expect(formatWindow(start, Date.UTC(2026, 10, 30, 12, 49), "Australia/Perth", 2026)).toBe(nb("11-30_18:21 → 20:49_GMT+8"));
    expect(formatWindow(null, Date.UTC(2026, 11, 2, 13, 49), "UTC", 2026)).toBe(nb("now → 12-02_13:49_UTC"));
    expect(formatWindow(start, null, "UTC", 2026)).toBe(nb("11-30_10:21_UTC → open end"));
    expect(formatWindow(null, null, "UTC", 2026)).toBeNull();
  });

  it("gives a date its year whenever that is not this year", async () => {
    const { formatWindow, yearInZone } = await import("@/lib/format/time");
    const start = Date.UTC(2026, 11, 31, 20, 0);
    // 20:00 UTC on 31 December is already 05:00 on 1 January 2027 in Tokyo (UTC+9, no daylight saving).
    expect(formatWindow(start, Date.UTC(2026, 11, 31, 22, 0), "UTC", 2026)).toBe(nb("12-31_20:00 → 22:00_UTC"));
    expect(formatWindow(start, Date.UTC(2027, 0, 1, 2, 0), "UTC", 2026)).toBe(nb("12-31_20:00 → 2027-01-01_02:00_UTC"));
    expect(formatWindow(null, Date.UTC(9999, 11, 31, 12, 0), "UTC", 2026)).toBe(nb("now → 9999-12-31_12:00_UTC"));
    expect(formatWindow(start, null, "UTC", 2025)).toBe(nb("2026-12-31_20:00_UTC → open end"));
    expect(yearInZone(start, "Asia/Tokyo")).toBe(2027);
    expect(yearInZone(start, "UTC")).toBe(2026);
  });
});

describe("numbers keep their units", () => {
  it("never leaves a breakable space between a digit and its unit in any formatter's output", async () => {
    const { formatClock, formatWindow } = await import("@/lib/format/time");
    const at = Date.UTC(2026, 10, 30, 10, 21);
    const samples = [
      ...[0.0004, 0.004, 0.5, 0.973, 0.9995].map(formatPercent),
      ...[0, 59, 125, 3725, 90_061].map(formatDuration),
      ...[5, 3700].map(formatAge),
      formatWithUncertainty(1.18763, 0.00412, "M☉"),
      formatWithUncertainty(412, 120, "Mpc"),
      ...[2e-7, 0.02, 4, 36.525, 1461].map(formatFalseAlarmRate),
      formatClock(at, "America/Santiago"),
      formatWindow(at, at + 7_200_000, "America/Santiago", 2026) ?? "",
    ];
    for (const text of samples) expect(text, text).not.toMatch(/\d (M☉|Mpc|%|s|min|h|d|years|days|million|billion|UTC|GMT)(?![\p{L}\d])|\d ±|± \d|\d{2}:\d{2} [A-Z]/u);
  });
});
