import { getDb } from "@/db";
import { ApiError } from "@/lib/api/errors";
import { comingNight, intervalsAboveAltitude } from "@/lib/astro";
import { findCatalogue, findDefaultCatalogue, galaxiesById, packsInCells } from "@/lib/data/catalogues";
import { getSite } from "@/lib/data/sites";
import { listCandidateSkymaps, readSkymapMap } from "@/lib/data/skymaps";
import { unpack } from "@/lib/galaxies/pack";
import { ensureGalaxyPacks } from "./pack-catalogue";
import { rankGalaxies, regionCells, type RankedGalaxy } from "@/lib/galaxies/rank";
import { credibleDensityThreshold } from "@/lib/skymap/region-threshold";
import type { GalaxyRankQuery } from "@/lib/validations/catalogues";

export interface GalaxyTarget extends Omit<RankedGalaxy, "id"> {
  name: string;
  raDeg: number;
  decDeg: number;
  /** the longest stretch of the site's coming astronomical night with the galaxy above the site's altitude limit */
  bestWindow: { start: string; end: string } | null;
}

export interface GalaxyTargets {
  skymapId: string;
  catalogueId: string;
  credibleLevel: number;
  /** galaxies of the catalogue inside the credible region: the ones scored, and the sum normalizedScore divides by */
  consideredRows: number;
  galaxies: GalaxyTarget[];
}

const noDistance = () => new ApiError(409, "this candidate's newest sky map has no distance columns (DISTMU, DISTSIGMA, DISTNORM), so galaxies cannot be ranked");

/**
 * Ranked galaxy targets for a candidate's newest sky map: the catalogue's ranking packs in the index cells of the
 * greedy credible region are read (never the whole catalogue), scored in lib/galaxies/rank.ts, and the best `limit` get
 * the site's window for tonight when a site is named.
 */
export async function rankCandidateGalaxies(candidateId: string, query: GalaxyRankQuery, now: Date): Promise<GalaxyTargets> {
  const [skymap] = await listCandidateSkymaps(candidateId);
  if (!skymap) throw new ApiError(404, "candidate not found, or it has no sky map yet");
  if (!skymap.distance) throw noDistance();
  const db = await getDb();
  const catalogue = query.catalogueId ? await findCatalogue(db, query.catalogueId) : await findDefaultCatalogue(db);
  if (!catalogue) throw new ApiError(404, query.catalogueId ? "catalogue not found" : "there is no galaxy catalogue yet; a coordinator uploads one");
  if (catalogue.state !== "ready") throw new ApiError(409, "the catalogue is still importing");
  const site = query.siteId ? await getSite(query.siteId) : null;

  const map = readSkymapMap(skymap.file.sha256);
  if (!map.distance) throw noDistance();
  await ensureGalaxyPacks(db, catalogue.id, catalogue.rowCount);
  const threshold = credibleDensityThreshold(map, query.level);
  const columns = unpack(await packsInCells(db, catalogue.id, regionCells(map, query.level, threshold)));
  const ranking = rankGalaxies(map, columns, { level: query.level, limit: query.limit, threshold });
  const stored = await galaxiesById(db, ranking.galaxies.map((g) => g.id));

  const location = site ? { latDeg: site.latitudeDeg, lonDeg: site.longitudeDeg, elevationM: site.elevationM } : null;
  const night = location ? comingNight(location, now) : null;
  const galaxies = ranking.galaxies.map(({ id, score, normalizedScore, cumulativeScore }) => {
    const row = stored.get(id);
    const g = { name: row?.name ?? "", raDeg: row?.raDeg ?? 0, decDeg: row?.decDeg ?? 0, distanceMpc: row?.distanceMpc ?? 0, weight: row?.weight ?? 0, score, normalizedScore, cumulativeScore };
    if (!site || !location || !night) return { ...g, bestWindow: null };
    const intervals = intervalsAboveAltitude(g, location, night.start, night.end, site.minAltitudeDeg);
    const best = intervals.reduce<(typeof intervals)[number] | null>((a, b) => (!a || b.end.getTime() - b.start.getTime() > a.end.getTime() - a.start.getTime() ? b : a), null);
    return { ...g, bestWindow: best ? { start: best.start.toISOString(), end: best.end.toISOString() } : null };
  });
  return { skymapId: skymap.id, catalogueId: catalogue.id, credibleLevel: query.level, consideredRows: ranking.considered, galaxies };
}
