import { and, desc, eq, gte, inArray, isNull, ne } from "drizzle-orm";
import { getDb } from "@/db";
import { candidates, instruments, skymaps, uploads, type TaskKind } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { comingNight, localSiderealTimeDeg, siteVisibility, type SiteVisibility } from "@/lib/astro";
import { credibleRegionPoints } from "@/lib/skymap";
import { footprintAreaDeg2 } from "@/lib/validations/instruments";
import { listSites, type SiteRecord } from "./sites";
import { readDisplayGrid } from "./skymaps";

export interface VisibilityWindow {
  start: string;
  end: string;
  /** Largest share of the region above the altitude limit at one instant. */
  probabilityAboveLimit: number;
}

/** What one site can do for one sky map during its coming astronomical night (Sun below −18°). */
export interface SiteVisibilityRow {
  site: Omit<SiteRecord, "observers" | "createdAt">;
  nightStart: string | null;
  nightEnd: string | null;
  nightEndCapped: boolean;
  /** Probability held by the 90 % region samples (about 0.9). */
  regionProbability: number;
  /** Share (0–1) of the 90 % region's probability that reaches the altitude limit during the night. */
  observableProbability: number;
  bestWindow: VisibilityWindow | null;
  moonSeparationDeg: number | null;
  moonIllumination: number;
  momentTime: string;
  /** For drawing the night-time observable band: local sidereal time at night start and its sweep to night end. */
  band: { lstStartDeg: number; lstSweepDeg: number } | null;
}

export interface CandidateVisibility {
  skymapId: string;
  computedAt: string;
  level: number;
  rows: SiteVisibilityRow[];
}

const REGION_LEVEL = 0.9;
const REGION_MAX_POINTS = 2048;
const CACHE_BUCKET_MS = 10 * 60_000;
const CACHE_ENTRIES = 2000;
const globalCache = globalThis as unknown as { chirpdeskVisibilityCache?: Map<string, SiteVisibility> };
const cache = (globalCache.chirpdeskVisibilityCache ??= new Map<string, SiteVisibility>());

type SiteFields = SiteVisibilityRow["site"];

/**
 * Site visibility for one stored sky map, cached per (map, site position and limit, 10-minute slot of `now`):
 * the night is the same all slot long and the answer changes only as the remaining night shortens.
 */
async function visibilityFor(sha256: string, site: SiteFields, now: Date): Promise<SiteVisibility> {
  const slot = Math.floor(now.getTime() / CACHE_BUCKET_MS);
  const key = [sha256, site.id, site.latitudeDeg, site.longitudeDeg, site.elevationM, site.minAltitudeDeg, slot].join("|");
  const hit = cache.get(key);
  if (hit) return hit;
  const grid = await readDisplayGrid(sha256);
  const region = credibleRegionPoints(grid, { level: REGION_LEVEL, maxPoints: REGION_MAX_POINTS });
  const slotStart = new Date(slot * CACHE_BUCKET_MS);
  const value = siteVisibility({
    site: { latDeg: site.latitudeDeg, lonDeg: site.longitudeDeg, elevationM: site.elevationM, minAltitudeDeg: site.minAltitudeDeg },
    region,
    now: slotStart,
  });
  cache.set(key, value);
  if (cache.size > CACHE_ENTRIES) {
    const oldest = cache.keys().next().value;
    if (oldest !== undefined) cache.delete(oldest);
  }
  return value;
}

function toRow(site: SiteFields, v: SiteVisibility): SiteVisibilityRow {
  const band =
    v.nightStart && v.nightEnd
      ? {
          lstStartDeg: localSiderealTimeDeg(v.nightStart, site.longitudeDeg),
          // sidereal time runs 1.0027379 times faster than solar time (Meeus eq. 12.4, the linear term)
          lstSweepDeg: Math.min(360, ((v.nightEnd.getTime() - v.nightStart.getTime()) / 86_400_000) * 360.98564736629),
        }
      : null;
  return {
    site,
    nightStart: v.nightStart?.toISOString() ?? null,
    nightEnd: v.nightEnd?.toISOString() ?? null,
    nightEndCapped: v.nightEndCapped,
    regionProbability: v.regionProbability,
    observableProbability: v.observableProbability,
    bestWindow: v.bestWindow
      ? { start: v.bestWindow.start.toISOString(), end: v.bestWindow.end.toISOString(), probabilityAboveLimit: v.bestWindow.probabilityAboveLimit }
      : null,
    moonSeparationDeg: Number.isFinite(v.moonSeparationDeg) ? v.moonSeparationDeg : null,
    moonIllumination: v.moonIllumination,
    momentTime: v.momentTime.toISOString(),
    band,
  };
}

function siteFields({ observers: _o, createdAt: _c, ...site }: SiteRecord): SiteFields {
  return site;
}

type RankedFields = Pick<SiteVisibilityRow, "observableProbability" | "bestWindow"> & { site: Pick<SiteFields, "code"> };

/**
 * Site order for a sky map: most of the region observable first; then most of it at one instant; then the sooner
 * window (a kilonova fades within days); then by site code, so the order never depends on the query's.
 */
export function compareVisibilityRows(a: RankedFields, b: RankedFields): number {
  const windowStart = (r: RankedFields) => (r.bestWindow ? Date.parse(r.bestWindow.start) : Number.POSITIVE_INFINITY);
  return (
    b.observableProbability - a.observableProbability ||
    (b.bestWindow?.probabilityAboveLimit ?? 0) - (a.bestWindow?.probabilityAboveLimit ?? 0) ||
    windowStart(a) - windowStart(b) ||
    a.site.code.localeCompare(b.site.code)
  );
}

/** Visibility of one sky map from every site, most observable first. */
export async function skymapVisibility(skymap: { id: string; sha256: string }, now: Date, siteList?: SiteRecord[]): Promise<CandidateVisibility> {
  const all = siteList ?? (await listSites());
  const rows: SiteVisibilityRow[] = [];
  for (const record of all) {
    const site = siteFields(record);
    rows.push(toRow(site, await visibilityFor(skymap.sha256, site, now)));
  }
  rows.sort(compareVisibilityRows);
  return { skymapId: skymap.id, computedAt: now.toISOString(), level: REGION_LEVEL, rows };
}

async function latestSkymap(candidateId: string): Promise<{ id: string; sha256: string; area90Deg2: number } | null> {
  const db = await getDb();
  const [row] = await db
    .select({ id: skymaps.id, sha256: uploads.sha256, area90Deg2: skymaps.area90Deg2 })
    .from(skymaps)
    .innerJoin(uploads, eq(uploads.id, skymaps.uploadId))
    .where(eq(skymaps.candidateId, candidateId))
    .orderBy(desc(skymaps.createdAt))
    .limit(1);
  return row ?? null;
}

/** Visibility of a candidate's newest sky map; null when it has none. 404 for an unknown candidate. */
export async function candidateVisibility(candidateId: string, now: Date): Promise<CandidateVisibility | null> {
  const db = await getDb();
  const [candidate] = await db.select({ id: candidates.id }).from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!candidate) throw new ApiError(404, "candidate not found");
  const skymap = await latestSkymap(candidateId);
  return skymap ? skymapVisibility(skymap, now) : null;
}

/** Each site's widest instrument footprint area (deg²), for the sites that have instruments. */
async function widestFieldsDeg2(siteIds: string[]): Promise<Map<string, number>> {
  const widest = new Map<string, number>();
  if (siteIds.length === 0) return widest;
  const db = await getDb();
  const rows = await db.select({ siteId: instruments.siteId, footprint: instruments.footprint }).from(instruments).where(inArray(instruments.siteId, siteIds));
  for (const row of rows) widest.set(row.siteId, Math.max(widest.get(row.siteId) ?? 0, footprintAreaDeg2(row.footprint)));
  return widest;
}

/** Task kind by field of view (common practice): a slit/fibre-sized field is for spectroscopy, a small imager for galaxy-targeted pointings, anything wider tiles the region. */
export function taskKindForFieldOfView(fieldOfViewDeg2: number): TaskKind {
  if (fieldOfViewDeg2 < 0.1) return "spectroscopy";
  if (fieldOfViewDeg2 < 1) return "galaxy-targeted";
  return "wide-field-tiling";
}

export interface TaskSuggestion {
  siteId: string;
  siteCode: string;
  siteName: string;
  siteTimeZone: string;
  kind: TaskKind;
  windowStart: string;
  windowEnd: string;
  priority: 1 | 2 | 3;
  notes: string;
  observableProbability: number;
  /** Pointings of the site's field needed to cover the observable part of the 90 % region (tiling only). */
  pointings: number | null;
}

export interface SuggestionOptions {
  maxSuggestions?: number;
  /** Sites with less of the region observable than this are not suggested. */
  minObservable?: number;
}

const pct = (x: number) => `${Math.round(x * 100)} %`;

/** One task per site with the most observable probability, best window first, kind by field of view. */
export async function suggestTasks(candidateId: string, now: Date, options: SuggestionOptions = {}): Promise<{ skymapId: string | null; suggestions: TaskSuggestion[] }> {
  const db = await getDb();
  const [candidate] = await db.select({ id: candidates.id }).from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!candidate) throw new ApiError(404, "candidate not found");
  const skymap = await latestSkymap(candidateId);
  if (!skymap) return { skymapId: null, suggestions: [] };
  const { rows } = await skymapVisibility(skymap, now);
  const minObservable = options.minObservable ?? 0.05;
  const chosen = rows.filter((r) => r.bestWindow && r.observableProbability >= minObservable).slice(0, options.maxSuggestions ?? 3);
  const fieldsDeg2 = await widestFieldsDeg2(chosen.map((r) => r.site.id));
  const suggestions = chosen.map((row, rank): TaskSuggestion => {
    const window = row.bestWindow as VisibilityWindow;
    // The site's widest instrument decides the kind; a site without instruments falls back to its old single field.
    const fieldDeg2 = fieldsDeg2.get(row.site.id) ?? row.site.fieldOfViewDeg2;
    const kind = taskKindForFieldOfView(fieldDeg2);
    const observableAreaDeg2 = skymap.area90Deg2 * row.observableProbability;
    const pointings = kind === "wide-field-tiling" ? Math.max(1, Math.ceil(observableAreaDeg2 / fieldDeg2)) : null;
    const moon = row.moonSeparationDeg === null ? "" : ` Moon ${Math.round(row.moonSeparationDeg)}° from the most probable position, ${pct(row.moonIllumination)} lit.`;
    const cover = pointings ? ` About ${pointings} pointing${pointings === 1 ? "" : "s"} of ${Math.round(fieldDeg2 * 100) / 100} deg² cover the observable part.` : "";
    return {
      siteId: row.site.id,
      siteCode: row.site.code,
      siteName: row.site.name,
      siteTimeZone: row.site.timeZone,
      kind,
      windowStart: window.start,
      windowEnd: window.end,
      priority: row.observableProbability >= 0.5 ? (rank === 0 ? 1 : 2) : 3,
      notes:
        `Suggested from the sky map: ${pct(row.observableProbability)} of the 90 % region rises above ${row.site.minAltitudeDeg}° ` +
        `during the coming night; up to ${pct(window.probabilityAboveLimit)} at once in this window.${cover}${moon}`,
      observableProbability: row.observableProbability,
      pointings,
    };
  });
  return { skymapId: skymap.id, suggestions };
}

export interface TonightSite {
  site: Omit<SiteRecord, "createdAt">;
  nightStart: string | null;
  nightEnd: string | null;
}

export interface TonightCandidate {
  id: string;
  source: string;
  externalId: string;
  receivedAt: string;
  skymapId: string;
  area90Deg2: number;
  /** By site id. */
  cells: Record<string, { observableProbability: number; bestWindow: VisibilityWindow | null }>;
}

/** For the sites page: each site's coming night, and what it can observe of recent candidates' newest sky maps. */
export async function tonightOverview(now: Date, options: { days: number; limit: number }): Promise<{ sites: TonightSite[]; candidates: TonightCandidate[] }> {
  const db = await getDb();
  const siteList = await listSites();
  const since = new Date(now.getTime() - options.days * 86_400_000);
  const recent = await db
    .select({ id: candidates.id, source: candidates.source, externalId: candidates.externalId, receivedAt: candidates.receivedAt })
    .from(candidates)
    .where(and(gte(candidates.receivedAt, since), isNull(candidates.withdrawnAt), ne(candidates.stage, "withdrawn")))
    .orderBy(desc(candidates.receivedAt))
    .limit(200);
  const maps = recent.length
    ? await db
        .select({ candidateId: skymaps.candidateId, id: skymaps.id, sha256: uploads.sha256, area90Deg2: skymaps.area90Deg2, createdAt: skymaps.createdAt })
        .from(skymaps)
        .innerJoin(uploads, eq(uploads.id, skymaps.uploadId))
        .where(inArray(skymaps.candidateId, recent.map((c) => c.id)))
        .orderBy(desc(skymaps.createdAt))
    : [];
  const newest = new Map<string, (typeof maps)[number]>();
  for (const m of maps) if (!newest.has(m.candidateId)) newest.set(m.candidateId, m);

  const out: TonightCandidate[] = [];
  for (const c of recent) {
    const map = newest.get(c.id);
    if (!map) continue;
    const { rows } = await skymapVisibility(map, now, siteList);
    out.push({
      id: c.id,
      source: c.source,
      externalId: c.externalId,
      receivedAt: c.receivedAt.toISOString(),
      skymapId: map.id,
      area90Deg2: map.area90Deg2,
      cells: Object.fromEntries(rows.map((r) => [r.site.id, { observableProbability: r.observableProbability, bestWindow: r.bestWindow }])),
    });
    if (out.length >= options.limit) break;
  }
  const sitesOut = siteList.map(({ createdAt: _c, ...site }) => {
    const night = comingNight({ latDeg: site.latitudeDeg, lonDeg: site.longitudeDeg, elevationM: site.elevationM }, now);
    return { site, nightStart: night?.start.toISOString() ?? null, nightEnd: night?.end.toISOString() ?? null };
  });
  return { sites: sitesOut, candidates: out };
}
