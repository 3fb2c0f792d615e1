import { describe, expect, it } from "vitest";
import { airmassToAltitudeDeg, altitudeDeg, comingNight, siteVisibility } from "@/lib/astro";
import { analyseSkymap, credibleRegionPoints } from "@/lib/skymap";
import { fixtureBytes } from "../skymap/fixture-files";
import { astroReference, minutesBetween } from "./reference";

const southSite = { latDeg: -29.3, lonDeg: -66.1, elevationM: 2100, minAltitudeDeg: 30 };
const northSite = { latDeg: 52, lonDeg: 5, elevationM: 50, minAltitudeDeg: 30 };
const summerNoon = new Date("2026-06-21T12:00:00Z");
const januaryNoon = new Date("2026-01-10T12:00:00Z");

describe("siteVisibility", () => {
  it("reports no night, nothing observable, at 52° N near the June solstice", () => {
    const result = siteVisibility({ site: northSite, region: [{ raDeg: 250, decDeg: 62, prob: 0.9 }], now: summerNoon });
    expect(result.nightStart).toBeNull();
    expect(result.nightEnd).toBeNull();
    expect(result.observableProbability).toBe(0);
    expect(result.bestWindow).toBeNull();
    expect(result.momentTime).toEqual(summerNoon);
    expect(result.moonIllumination).toBeGreaterThanOrEqual(0);
  });

  it("counts a circumpolar sample fully and one that never rises not at all", () => {
    const region = [
      { raDeg: 10, decDeg: 85, prob: 0.6 }, // always at ≥ 52 − 5 = 47° from 52° N
      { raDeg: 10, decDeg: -80, prob: 0.3 }, // never above the horizon
    ];
    const result = siteVisibility({ site: northSite, region, now: new Date("2026-03-20T12:00:00Z") });
    expect(result.regionProbability).toBeCloseTo(0.9, 12);
    expect(result.observableProbability).toBeCloseTo(0.6 / 0.9, 12);
    expect(result.bestWindow?.probabilityAboveLimit).toBeCloseTo(0.6 / 0.9, 12);
    // the whole night qualifies, so the window spans it
    expect(result.bestWindow?.start).toEqual(result.nightStart);
    expect(result.bestWindow?.end).toEqual(result.nightEnd);
  });

  it.each(["2026-01-10T12:00:00Z", "2026-06-21T15:00:00Z"])(
    "puts the best window for one target where astropy has it above 30° during the night (from %s)",
    (nowIso) => {
      const c = astroReference.cases.find((x) => x.site === "plateau-south" && Date.parse(x.now) === Date.parse(nowIso));
      if (!c) throw new Error("fixture case missing");
      const result = siteVisibility({ site: southSite, region: [{ ...astroReference.targets.south, prob: 1 }], now: new Date(nowIso) });
      if (!result.bestWindow || !result.nightStart || !result.nightEnd) throw new Error("expected a night and a window");
      // astropy's intervals above 30°, cut to the night
      const crossings = c.targetCrossings.south.map((x) => ({ ms: Date.parse(x.time), rising: x.rising }));
      let from: number | null = crossings[0]?.rising === false ? Date.parse(c.now) : null;
      const intervals: Array<[number, number]> = [];
      for (const x of crossings) {
        if (x.rising) from = x.ms;
        else if (from !== null) intervals.push([from, x.ms]);
      }
      const [start, end] = intervals
        .map(([a, b]) => [Math.max(a, result.nightStart?.getTime() ?? 0), Math.min(b, result.nightEnd?.getTime() ?? 0)] as const)
        .find(([a, b]) => a < b) ?? [Number.NaN, Number.NaN];
      expect(result.observableProbability).toBe(1);
      // the window runs on a 10-minute grid from the night's start, so it may start or end up to a step inside
      expect(result.bestWindow.start.getTime()).toBeGreaterThanOrEqual(start - 2 * 60_000);
      expect(result.bestWindow.start.getTime() - start).toBeLessThanOrEqual(10 * 60_000);
      expect(result.bestWindow.end.getTime()).toBeLessThanOrEqual(end + 2 * 60_000);
      expect(end - result.bestWindow.end.getTime()).toBeLessThanOrEqual(10 * 60_000);
    },
  );

  it("agrees with a slow per-sample altitude check on the fixture's 90 % region", () => {
    const analysed = analyseSkymap(fixtureBytes("bimodal-ring-n128.fits.gz"));
    if (!analysed.ok) throw new Error(analysed.error.message);
    const region = credibleRegionPoints(analysed.map, { maxPoints: 800 });
    const result = siteVisibility({ site: southSite, region, now: januaryNoon });
    const night = comingNight(southSite, januaryNoon);
    if (!night) throw new Error("expected a night");
    const total = region.reduce((s, p) => s + p.prob, 0);
    let seen = 0;
    for (const point of region) {
      for (let t = night.start.getTime(); ; t = Math.min(t + 600_000, night.end.getTime())) {
        if (altitudeDeg(point, southSite, new Date(t)) >= southSite.minAltitudeDeg) {
          seen += point.prob;
          break;
        }
        if (t >= night.end.getTime()) break;
      }
    }
    expect(result.observableProbability).toBeGreaterThan(0.5);
    expect(Math.abs(result.observableProbability - seen / total)).toBeLessThan(0.005);
    expect(result.moonSeparationDeg).toBeGreaterThan(0);
    expect(result.moonSeparationDeg).toBeLessThanOrEqual(180);
  });

  it("caps a polar night at 24 hours after it starts", () => {
    const polar = { latDeg: 87, lonDeg: 0, elevationM: 0, minAltitudeDeg: 20 };
    const result = siteVisibility({ site: polar, region: [{ raDeg: 0, decDeg: 80, prob: 1 }], now: new Date("2026-12-21T00:00:00Z") });
    expect(result.nightEndCapped).toBe(true);
    expect(result.nightStart?.toISOString()).toBe("2026-12-21T00:00:00.000Z");
    expect(result.nightEnd && minutesBetween(result.nightEnd, "2026-12-22T00:00:00Z")).toBe(0);
    expect(result.observableProbability).toBe(1);
  });
});

describe("airmassToAltitudeDeg (plane-parallel sec z, common practice)", () => {
  it("gives 30° for airmass 2 and 90° for airmass 1", () => {
    expect(airmassToAltitudeDeg(2)).toBeCloseTo(30, 12);
    expect(airmassToAltitudeDeg(1)).toBeCloseTo(90, 12);
    expect(() => airmassToAltitudeDeg(0.5)).toThrow(RangeError);
  });
});
