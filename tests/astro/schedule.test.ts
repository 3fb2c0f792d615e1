import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import {
  airmassAtAltitude,
  astronomicalNights,
  intersectIntervals,
  intervalsAboveAltitude,
  moonSeparationDeg,
  targetAltitudeAndAirmass,
  type TimeInterval,
} from "@/lib/astro/schedule";

// Reference: astropy (Debian python3-astropy), tests/fixtures/scripts/astro_schedule_fixtures.py
// (30 s grid, edges interpolated). Altitude and Moon distance within 1′; interval edges within 2 minutes.

interface Span {
  start: string;
  end: string;
}
interface ScheduleCase {
  site: string;
  latDeg: number;
  lonDeg: number;
  elevationM: number;
  start: string;
  end: string;
  target: { raDeg: number; decDeg: number };
  nights: Span[];
  above: Span[];
  samples: Array<{ time: string; altDeg: number; airmass: number | null; moonSeparationDeg: number }>;
}
const reference = JSON.parse(
  readFileSync(fileURLToPath(new URL("../fixtures/astro/schedule.json", import.meta.url)), "utf8"),
) as { limitDeg: number; cases: ScheduleCase[] };

const ARCMIN_DEG = 1 / 60;
const minutesApart = (a: Date, b: string) => Math.abs(a.getTime() - Date.parse(b)) / 60_000;

function expectSameIntervals(got: TimeInterval[], expected: Span[]) {
  expect(got).toHaveLength(expected.length);
  got.forEach((interval, i) => {
    expect(minutesApart(interval.start, expected[i]?.start ?? "")).toBeLessThan(2);
    expect(minutesApart(interval.end, expected[i]?.end ?? "")).toBeLessThan(2);
  });
}

describe.each(reference.cases.map((c) => [`${c.site} from ${c.start}`, c] as const))("%s", (_, c) => {
  const site = { latDeg: c.latDeg, lonDeg: c.lonDeg, elevationM: c.elevationM };
  const from = new Date(c.start);
  const to = new Date(c.end);

  it("finds the astronomical nights astropy finds", () => {
    expectSameIntervals(astronomicalNights(site, from, to), c.nights);
  });

  it("finds the intervals above the altitude limit astropy finds", () => {
    expectSameIntervals(intervalsAboveAltitude(c.target, site, from, to, reference.limitDeg), c.above);
  });

  it.each(c.samples.map((s) => [s.time, s] as const))("altitude, airmass and Moon distance at %s", (time, s) => {
    const date = new Date(time);
    const { altDeg, airmass } = targetAltitudeAndAirmass(c.target, site, date);
    expect(Math.abs(altDeg - s.altDeg)).toBeLessThan(ARCMIN_DEG);
    if (s.airmass === null) expect(airmass).toBeNull();
    else expect(Math.abs((airmass ?? Infinity) - s.airmass) / s.airmass).toBeLessThan(1e-3);
    expect(Math.abs(moonSeparationDeg(c.target, site, date) - s.moonSeparationDeg)).toBeLessThan(ARCMIN_DEG);
  });
});

describe("interval helpers", () => {
  const at = (h: number) => new Date(Date.UTC(2026, 0, 1, h));

  it("airmass is sec z above the horizon and null at or below it", () => {
    expect(airmassAtAltitude(90)).toBeCloseTo(1, 12);
    expect(airmassAtAltitude(30)).toBeCloseTo(2, 12);
    expect(airmassAtAltitude(0)).toBeNull();
    expect(airmassAtAltitude(-5)).toBeNull();
  });

  it("intersects sorted interval lists, dropping touching ends", () => {
    const nights = [{ start: at(0), end: at(6) }, { start: at(18), end: at(23) }];
    const above = [{ start: at(4), end: at(19) }, { start: at(22), end: at(23) }];
    expect(intersectIntervals(nights, above)).toEqual([
      { start: at(4), end: at(6) },
      { start: at(18), end: at(19) },
      { start: at(22), end: at(23) },
    ]);
    expect(intersectIntervals([{ start: at(0), end: at(2) }], [{ start: at(2), end: at(3) }])).toEqual([]);
  });

  it("an empty or reversed window has no intervals", () => {
    const site = { latDeg: 52, lonDeg: 5, elevationM: 0 };
    expect(astronomicalNights(site, at(3), at(3))).toEqual([]);
    expect(intervalsAboveAltitude({ raDeg: 0, decDeg: 0 }, site, at(5), at(3), 30)).toEqual([]);
  });
});
