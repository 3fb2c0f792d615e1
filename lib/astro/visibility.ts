import { DEG, type Equatorial, j2000ToOfDate } from "./coords";
import { moonIlluminatedFraction } from "./moon";
import { comingNight } from "./night";
import { moonSeparationDeg } from "./schedule";
import type { Site } from "./site";
import { localSiderealTimeDeg } from "./time";

/** A probability sample of a sky region (J2000 / ICRS position). */
export interface WeightedPosition extends Equatorial {
  prob: number;
}

export interface SiteVisibilityInput {
  site: Site;
  region: ReadonlyArray<WeightedPosition>;
  now: Date;
  /** Sampling step through the night; 10 minutes by default. */
  stepMinutes?: number;
  /** The best window is the run of steps holding at least this share of the best step; 0.9 by default. */
  windowShare?: number;
}

export interface ObservingWindow {
  start: Date;
  end: Date;
  /** Largest share of the region's probability above the altitude limit at one instant. */
  probabilityAboveLimit: number;
}

export interface SiteVisibility {
  /** Null when the site has no astronomical night (Sun below −18°) starting within 24 h, e.g. polar summer. */
  nightStart: Date | null;
  nightEnd: Date | null;
  /** The night had not ended 24 h after it began (polar night); nightEnd is that cap. */
  nightEndCapped: boolean;
  /** Total probability of the region samples (about 0.9 for a 90 % region). */
  regionProbability: number;
  /** Share (0–1) of the region's probability above the altitude limit at some step of the night. */
  observableProbability: number;
  bestWindow: ObservingWindow | null;
  /** Topocentric Moon to the region's most probable sample, at momentTime. */
  moonSeparationDeg: number;
  moonIllumination: number;
  /** Middle of the night, or `now` when there is no night: when the Moon figures apply. */
  momentTime: Date;
}

/**
 * What a site can observe of a sky region during the coming astronomical night: the night is stepped
 * (10 min by default) and a sample counts as observable once its geometric altitude reaches the site's
 * limit (positions, precession, nutation and sidereal time from astronomy-engine; the altitude of each
 * sample by sin(alt) = sin φ sin δ + cos φ cos δ cos H, Meeus eq. 13.6).
 */
export function siteVisibility(input: SiteVisibilityInput): SiteVisibility {
  const { site, region, now } = input;
  const stepMs = (input.stepMinutes ?? 10) * 60_000;
  const night = comingNight(site, now);
  const momentTime = night ? new Date((night.start.getTime() + night.end.getTime()) / 2) : now;
  const regionProbability = region.reduce((sum, p) => sum + p.prob, 0);
  const peak = region.reduce<WeightedPosition | undefined>((best, p) => (!best || p.prob > best.prob ? p : best), undefined);

  const base = {
    nightStart: night?.start ?? null,
    nightEnd: night?.end ?? null,
    nightEndCapped: night?.endCapped ?? false,
    regionProbability,
    moonSeparationDeg: peak ? moonSeparationDeg(peak, site, momentTime) : Number.NaN,
    moonIllumination: moonIlluminatedFraction(momentTime),
    momentTime,
  };
  if (!night || !(regionProbability > 0)) return { ...base, observableProbability: 0, bestWindow: null };

  // Take every sample to the equator of date once, at the middle of the night (drift over a night < 0.1″)
  const count = region.length;
  const raDeg = new Float64Array(count);
  const sinDec = new Float64Array(count);
  const cosDec = new Float64Array(count);
  region.forEach((point, i) => {
    const ofDate = j2000ToOfDate(point, momentTime);
    raDeg[i] = ofDate.raDeg;
    sinDec[i] = Math.sin(ofDate.decDeg * DEG);
    cosDec[i] = Math.cos(ofDate.decDeg * DEG);
  });
  const sinLat = Math.sin(site.latDeg * DEG);
  const cosLat = Math.cos(site.latDeg * DEG);
  const sinLimit = Math.sin(site.minAltitudeDeg * DEG);

  const seen = new Uint8Array(count);
  const times: Date[] = [];
  const shares: number[] = [];
  for (let t = night.start.getTime(); ; t = Math.min(t + stepMs, night.end.getTime())) {
    const lst = localSiderealTimeDeg(new Date(t), site.lonDeg);
    let above = 0;
    for (let i = 0; i < count; i++) {
      // sin(alt) = sin φ sin δ + cos φ cos δ cos H  (Meeus eq. 13.6)
      const sinAlt = sinLat * (sinDec[i] ?? 0) + cosLat * (cosDec[i] ?? 0) * Math.cos((lst - (raDeg[i] ?? 0)) * DEG);
      if (sinAlt >= sinLimit) {
        above += region[i]?.prob ?? 0;
        seen[i] = 1;
      }
    }
    times.push(new Date(t));
    shares.push(above / regionProbability);
    if (t >= night.end.getTime()) break;
  }
  let observable = 0;
  for (let i = 0; i < count; i++) if (seen[i]) observable += region[i]?.prob ?? 0;
  return {
    ...base,
    observableProbability: observable / regionProbability,
    bestWindow: bestWindow(times, shares, input.windowShare ?? 0.9),
  };
}

/** The contiguous run of steps around the first best step whose share stays ≥ windowShare × best. */
function bestWindow(times: Date[], shares: number[], windowShare: number): ObservingWindow | null {
  let best = 0;
  for (let k = 1; k < shares.length; k++) if ((shares[k] ?? 0) > (shares[best] ?? 0)) best = k;
  const top = shares[best] ?? 0;
  if (!(top > 0)) return null;
  let first = best;
  let last = best;
  while (first > 0 && (shares[first - 1] ?? 0) >= windowShare * top) first--;
  while (last + 1 < shares.length && (shares[last + 1] ?? 0) >= windowShare * top) last++;
  const start = times[first];
  const end = times[last];
  return start && end ? { start, end, probabilityAboveLimit: top } : null;
}
