import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { schedulePointings, type ScheduleSite } from "@/lib/planning/schedule";

// Reference sky from astropy: tests/fixtures/scripts/plan_schedule_fixtures.py (Debian python3-astropy).
interface Sky {
  site: ScheduleSite;
  start: string;
  end: string;
  stepS: number;
  sunAltitudeDeg: number[];
  targets: Array<{ target: { raDeg: number; decDeg: number }; altitudeDeg: number[]; moonSeparationDeg: number[] }>;
}
const sky = JSON.parse(readFileSync(new URL("../fixtures/planning/schedule-sky.json", import.meta.url), "utf8")) as Sky;
const t0 = Date.parse(sky.start);
const window = { start: new Date(t0), end: new Date(Date.parse(sky.end)) };

/** astropy's value at a time, linearly interpolated on the 1-minute grid (curvature error well under 1″). */
function at(series: number[], date: Date): number {
  const x = (date.getTime() - t0) / (sky.stepS * 1000);
  const i = Math.min(series.length - 2, Math.max(0, Math.floor(x)));
  const a = series[i] ?? NaN;
  const b = series[i + 1] ?? NaN;
  return a + (b - a) * (x - i);
}

const TOLERANCE_DEG = 1 / 60; // astronomy-engine against astropy: within 1′ (lib/astro checks)
const targets = sky.targets.map((t) => t.target);
const request = { site: sky.site, window, exposureS: 600, overheadS: 120 };
const plan = schedulePointings(targets, request);

describe("schedulePointings against astropy at every planned start and end", () => {
  it("schedules the observable fields and says why the others are not", () => {
    expect(plan.filter((p) => p.plannedStart).length).toBeGreaterThanOrEqual(6);
    expect(plan[9]?.unscheduledReason).toBe("too-close-to-moon"); // placed 6° from the Moon
    expect(plan[10]?.unscheduledReason).toBe("not-observable-in-window"); // culminates below the limit
  });

  it.each(plan.map((p, i) => [i, p] as const).filter(([, p]) => p.plannedStart))("pointing %i meets every constraint", (i, p) => {
    const ref = sky.targets[i];
    if (!ref || !p.plannedStart || !p.plannedEnd) throw new Error("missing");
    expect(p.plannedEnd.getTime() - p.plannedStart.getTime()).toBe(600_000);
    for (const t of [p.plannedStart, p.plannedEnd]) {
      expect(t.getTime()).toBeGreaterThanOrEqual(window.start.getTime());
      expect(t.getTime()).toBeLessThanOrEqual(window.end.getTime());
      expect(at(sky.sunAltitudeDeg, t)).toBeLessThanOrEqual(-18 + TOLERANCE_DEG);
      expect(at(ref.altitudeDeg, t)).toBeGreaterThanOrEqual(sky.site.minAltitudeDeg - TOLERANCE_DEG);
      expect(at(ref.moonSeparationDeg, t)).toBeGreaterThanOrEqual(20 - TOLERANCE_DEG);
    }
    expect(Math.abs((p.altitudeDeg ?? NaN) - at(ref.altitudeDeg, p.plannedStart))).toBeLessThan(TOLERANCE_DEG);
    expect(Math.abs((p.moonSeparationDeg ?? NaN) - at(ref.moonSeparationDeg, p.plannedStart))).toBeLessThan(TOLERANCE_DEG);
    expect(p.airmass).toBeCloseTo(1 / Math.sin(((p.altitudeDeg ?? 0) * Math.PI) / 180), 10);
  });

  it("runs one after another with the overhead between, no overlap, fields that set first going first", () => {
    const scheduled = plan.flatMap((p, i) => (p.plannedStart && p.plannedEnd ? [{ i, start: p.plannedStart.getTime(), end: p.plannedEnd.getTime() }] : []));
    scheduled.sort((a, b) => a.start - b.start);
    // when each field leaves the usable sky (last minute above the limit in the night), from astropy
    const setsAt = (i: number) => {
      const alt = sky.targets[i]?.altitudeDeg ?? [];
      let last = -1;
      alt.forEach((a, k) => { if (a >= sky.site.minAltitudeDeg && (sky.sunAltitudeDeg[k] ?? 0) <= -18) last = k; });
      return last;
    };
    for (let k = 1; k < scheduled.length; k++) {
      const [prev, next] = [scheduled[k - 1], scheduled[k]];
      if (!prev || !next) continue;
      expect(next.start - prev.end).toBeGreaterThanOrEqual(120_000);
      expect(setsAt(next.i)).toBeGreaterThanOrEqual(setsAt(prev.i) - 2); // within the 1-min grid's reach
    }
  });

  it("a pointing that no longer fits keeps plannedStart null with a reason", () => {
    const night = plan.filter((p) => p.plannedStart).map((p) => p.plannedStart?.getTime() ?? 0);
    const firstStart = Math.min(...night);
    const short = schedulePointings(targets.slice(0, 8), { ...request, window: { start: new Date(firstStart - 120_000), end: new Date(firstStart + 25 * 60_000) } });
    expect(short.filter((p) => p.plannedStart).length).toBeLessThanOrEqual(2); // 25 min holds two 12-min slots
    expect(short.some((p) => p.unscheduledReason === "no-time-left" || p.unscheduledReason === "not-observable-in-window")).toBe(true);
    expect(short.every((p) => (p.plannedStart === null) === (p.unscheduledReason !== null))).toBe(true);
  });

  it("a larger Moon distance setting is honoured", () => {
    const strict = schedulePointings(targets, { ...request, site: { ...sky.site, moonDistanceDeg: 60 } });
    for (const [i, p] of strict.entries()) {
      if (p.plannedStart) expect(at(sky.targets[i]?.moonSeparationDeg ?? [], p.plannedStart)).toBeGreaterThanOrEqual(60 - TOLERANCE_DEG);
    }
  });
});
