import {
  astronomicalNights,
  DEFAULT_MOON_DISTANCE_DEG,
  intersectIntervals,
  intervalsAboveAltitude,
  moonSeparationDeg,
  targetAltitudeAndAirmass,
  type TimeInterval,
} from "@/lib/astro/schedule";
import type { Site } from "@/lib/astro/site";
import type { SkyPosition } from "@/lib/skymap/types";

export interface ScheduleSite extends Site {
  /** Closest approach to the Moon a pointing may have; DEFAULT_MOON_DISTANCE_DEG (20°) when absent. */
  moonDistanceDeg?: number;
}

export interface ScheduleRequest {
  site: ScheduleSite;
  window: TimeInterval;
  exposureS: number;
  /** Slew + readout before each exposure. */
  overheadS: number;
}

export type UnscheduledReason = "not-observable-in-window" | "too-close-to-moon" | "no-time-left";

export interface ScheduledPointing {
  plannedStart: Date | null;
  plannedEnd: Date | null;
  altitudeDeg: number | null;
  airmass: number | null;
  moonSeparationDeg: number | null;
  unscheduledReason: UnscheduledReason | null;
}

/** Steps when a Moon-blocked start is moved on; the Moon moves about 0.5° an hour across the sky. */
const MOON_STEP_MS = 5 * 60_000;

/**
 * Times for pointings (answer in the input order). Each exposure [plannedStart, plannedEnd] lies inside the
 * window, inside an astronomical night (Sun below −18°) and inside one interval where the field is above the
 * site's altitude limit (so the whole exposure is above it; altitude is smooth, edges from a 10-min grid refined by
 * bisection), with the Moon at least moonDistanceDeg away at its start and its end. Each exposure waits
 * overheadS after the previous one ends (the first: after the window starts); none overlap.
 * Ordering rule: fields that set first go first (earliest end of observability within the window; ties keep
 * the plan's order), each at the earliest time that fits after the one before.
 */
export function schedulePointings(pointings: readonly SkyPosition[], request: ScheduleRequest): ScheduledPointing[] {
  const { site, window, exposureS, overheadS } = request;
  const moonLimitDeg = site.moonDistanceDeg ?? DEFAULT_MOON_DISTANCE_DEG;
  const nights = astronomicalNights(site, window.start, window.end);
  const usable = pointings.map((p) =>
    nights.length === 0 ? [] : intersectIntervals(nights, intervalsAboveAltitude(p, site, window.start, window.end, site.minAltitudeDeg)),
  );
  const setsAt = usable.map((list) => list.at(-1)?.end.getTime() ?? Infinity);
  const order = pointings.map((_, i) => i).sort((a, b) => (setsAt[a] ?? 0) - (setsAt[b] ?? 0) || a - b);

  const out: ScheduledPointing[] = pointings.map(() => unscheduled("not-observable-in-window"));
  const exposureMs = exposureS * 1000;
  let cursorMs = window.start.getTime();
  for (const i of order) {
    const target = pointings[i];
    const intervals = usable[i] ?? [];
    if (!target || intervals.length === 0) continue;
    const found = firstFit(intervals, cursorMs + overheadS * 1000, exposureMs, (t) =>
      moonSeparationDeg(target, site, t) >= moonLimitDeg,
    );
    if (found === "moon" || found === "late") {
      out[i] = unscheduled(found === "moon" ? "too-close-to-moon" : "no-time-left");
      continue;
    }
    const start = new Date(found);
    const end = new Date(found + exposureMs);
    const { altDeg, airmass } = targetAltitudeAndAirmass(target, site, start);
    out[i] = { plannedStart: start, plannedEnd: end, altitudeDeg: altDeg, airmass, moonSeparationDeg: moonSeparationDeg(target, site, start), unscheduledReason: null };
    cursorMs = end.getTime();
  }
  return out;
}

/** Earliest exposure start ≥ earliestMs inside one interval with the Moon clear at both ends of the exposure. */
function firstFit(
  intervals: TimeInterval[],
  earliestMs: number,
  exposureMs: number,
  moonClear: (t: Date) => boolean,
): number | "moon" | "late" {
  let blockedByMoon = false;
  for (const interval of intervals) {
    const lastStart = interval.end.getTime() - exposureMs;
    for (let t = Math.max(earliestMs, interval.start.getTime()); t <= lastStart; t += MOON_STEP_MS) {
      if (moonClear(new Date(t)) && moonClear(new Date(t + exposureMs))) return t;
      blockedByMoon = true;
    }
  }
  return blockedByMoon ? "moon" : "late";
}

function unscheduled(reason: UnscheduledReason): ScheduledPointing {
  return { plannedStart: null, plannedEnd: null, altitudeDeg: null, airmass: null, moonSeparationDeg: null, unscheduledReason: reason };
}
