import { readFileSync } from "node:fs";
import { and, desc, eq, type SQL } from "drizzle-orm";
import { getDb } from "@/db";
import { candidateRevisions, candidates, skymaps, triggers, uploads, users, type Skymap, type SkymapDistance } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { eventKinds } from "@/lib/events/kinds";
import {
  analyseSkymap,
  coneProbability,
  decodeDisplayGrid,
  encodeDisplayGrid,
  loadSkymap,
  pixelDistance,
  pixelLocator,
  SkymapCache,
  toDisplayGrid,
  type DisplayGrid,
  type SkymapErrorCode,
  type SkymapMap,
} from "@/lib/skymap";
import { readStored, storeBytes, storeDerived, storedExists, storedPath, type StoredFile } from "@/lib/storage";
import { maxSkymapBytes, type SkymapUploadAnswer } from "@/lib/validations/skymaps";
import { appendEvent } from "./events";
import { cleanFileName, discardStored, uploadUrl } from "./uploads";

/** The display grid is stored beside its FITS file as `<sha256>.grid64` (HPXG, see lib/skymap/display-grid). */
export const DISPLAY_GRID_SUFFIX = "grid64";
export const DISPLAY_NSIDE = 64;

// Parsed maps for cone queries (native resolution), and decoded display grids, per process.
const globalCaches = globalThis as unknown as { chirpdeskSkymapCache?: SkymapCache; chirpdeskGridCache?: Map<string, DisplayGrid> };
const mapCache = (globalCaches.chirpdeskSkymapCache ??= new SkymapCache(256 * 1024 * 1024));
const gridCache = (globalCaches.chirpdeskGridCache ??= new Map<string, DisplayGrid>());
const GRID_CACHE_ENTRIES = 64;

/** A wrong kind of file is 415; a FITS file with bad content 422; too big 413. */
export function skymapErrorStatus(code: SkymapErrorCode): number {
  if (code === "too-large") return 413;
  if (code === "not-fits") return 415;
  return 422;
}

export type SkymapTarget = { candidateId: string } | { source: string; externalId: string };

export interface SkymapUploadInput {
  target: SkymapTarget;
  fileName: string;
  bytes: Uint8Array;
  /** null when the feed uploads */
  actorId: string | null;
  via: "ui" | "feed";
  now?: Date;
}

/**
 * Validates and stores a sky map for a candidate's current revision. Order: candidate exists (404) → analysis
 * (413/415/422, nothing stored) → file and display grid stored content-addressed → upload and sky-map rows and
 * the `skymap.uploaded` event in one transaction. If the transaction fails, files this call created are removed.
 */
export async function uploadSkymap(input: SkymapUploadInput): Promise<SkymapUploadAnswer> {
  const now = input.now ?? new Date();
  const db = await getDb();
  const candidate = await findCandidate(input.target);
  const analysed = analyseSkymap(input.bytes, { maxBytes: maxSkymapBytes });
  if (!analysed.ok) {
    const { code, message } = analysed.error;
    throw new ApiError(skymapErrorStatus(code), `sky map refused: ${message}`, { code });
  }
  const { summary, map } = analysed;
  const grid = toDisplayGrid(map, DISPLAY_NSIDE);
  const gzip = input.bytes[0] === 0x1f && input.bytes[1] === 0x8b;

  let stored: StoredFile | undefined;
  try {
    stored = await storeBytes(input.bytes);
    await storeDerived(stored.sha256, DISPLAY_GRID_SUFFIX, encodeDisplayGrid(grid));
    const sha256 = stored.sha256;
    const row = await db.transaction(async (tx) => {
      const [upload] = await tx
        .insert(uploads)
        .values({
          sha256,
          kind: "skymap",
          originalName: cleanFileName(input.fileName),
          mimeType: gzip ? "application/gzip" : "application/fits",
          sizeBytes: input.bytes.byteLength,
          uploadedById: input.actorId,
          createdAt: now,
        })
        .returning({ id: uploads.id });
      if (!upload) throw new Error("upload insert returned nothing");
      const [revision] = await tx
        .select({ id: candidateRevisions.id })
        .from(candidateRevisions)
        .where(and(eq(candidateRevisions.triggerId, candidate.triggerId ?? ""), eq(candidateRevisions.revision, candidate.currentRevision)))
        .limit(1);
      const [skymap] = await tx
        .insert(skymaps)
        .values({
          uploadId: upload.id,
          candidateId: candidate.id,
          revisionId: revision?.id ?? null,
          layout: summary.layout,
          // multi-order maps: the finest resolution present, as an nside
          nside: summary.nside ?? 2 ** (summary.maxOrder ?? 0),
          pixelCount: summary.pixelCount,
          totalProbability: summary.totalProbability,
          area50Deg2: summary.area50Deg2,
          area90Deg2: summary.area90Deg2,
          peakRaDeg: summary.peak.raDeg,
          peakDecDeg: summary.peak.decDeg,
          warnings: summary.warnings,
          distance: summary.distance ?? null,
          createdAt: now,
        })
        .returning();
      if (!skymap) throw new Error("sky-map insert returned nothing");
      await appendEvent(tx, {
        at: now,
        kind: eventKinds.skymapUploaded,
        actorId: input.actorId,
        candidateId: candidate.id,
        data: { skymapId: skymap.id, area90Deg2: summary.area90Deg2, via: input.via, revision: candidate.currentRevision },
      });
      return skymap;
    });
    mapCache.get(sha256, () => map); // the first cone query need not parse the file again
    return {
      id: row.id,
      sha256,
      totalProbability: summary.totalProbability,
      area50Deg2: summary.area50Deg2,
      area90Deg2: summary.area90Deg2,
      peak: summary.peak,
      warnings: summary.warnings,
    };
  } catch (error) {
    if (stored) await discardStored([stored], [DISPLAY_GRID_SUFFIX]);
    throw error;
  }
}

async function findCandidate(target: SkymapTarget) {
  const db = await getDb();
  const where =
    "candidateId" in target
      ? eq(candidates.id, target.candidateId)
      : and(eq(triggers.source, target.source), eq(triggers.externalId, target.externalId));
  // A feed names its own trigger; the map belongs to the candidate that trigger is grouped into.
  const [row] =
    "candidateId" in target
      ? await db
          .select({ id: candidates.id, currentRevision: candidates.currentRevision, triggerId: candidates.preferredTriggerId })
          .from(candidates)
          .where(where)
          .limit(1)
      : await db
          .select({ id: triggers.candidateId, currentRevision: triggers.currentRevision, triggerId: triggers.id })
          .from(triggers)
          .where(where)
          .limit(1);
  if (!row) {
    const what = "candidateId" in target ? target.candidateId : `${target.source}/${target.externalId}`;
    throw new ApiError(404, `candidate ${what} not found`);
  }
  return row;
}

export interface SkymapInfo {
  id: string;
  candidateId: string;
  revision: number | null;
  layout: string;
  nside: number | null;
  pixelCount: number;
  totalProbability: number;
  area50Deg2: number;
  area90Deg2: number;
  peak: { raDeg: number; decDeg: number };
  warnings: string[];
  /** Rapid distance estimate of a 3D map (Singer et al. 2016 ansatz); null without distance columns. */
  distance: SkymapDistance | null;
  createdAt: string;
  file: { uploadId: string; name: string; sha256: string; sizeBytes: number; url: string };
  uploadedBy: { id: string; name: string } | null;
}

/** Sky maps with their file, revision number and uploader, newest first. */
async function selectSkymaps(where: SQL, limit: number): Promise<SkymapRow[]> {
  const db = await getDb();
  return db
    .select({
      skymap: skymaps,
      revision: candidateRevisions.revision,
      upload: { id: uploads.id, name: uploads.originalName, sha256: uploads.sha256, sizeBytes: uploads.sizeBytes },
      uploader: { id: users.id, name: users.name },
    })
    .from(skymaps)
    .innerJoin(uploads, eq(uploads.id, skymaps.uploadId))
    .leftJoin(candidateRevisions, eq(candidateRevisions.id, skymaps.revisionId))
    .leftJoin(users, eq(users.id, uploads.uploadedById))
    .where(where)
    .orderBy(desc(skymaps.createdAt))
    .limit(limit);
}

interface SkymapRow {
  skymap: Skymap;
  revision: number | null;
  upload: { id: string; name: string; sha256: string; sizeBytes: number };
  uploader: { id: string; name: string } | null;
}

function toInfo({ skymap, revision, upload, uploader }: SkymapRow): SkymapInfo {
  return {
    id: skymap.id,
    candidateId: skymap.candidateId,
    revision,
    layout: skymap.layout,
    nside: skymap.nside,
    pixelCount: skymap.pixelCount,
    totalProbability: skymap.totalProbability,
    area50Deg2: skymap.area50Deg2,
    area90Deg2: skymap.area90Deg2,
    peak: { raDeg: skymap.peakRaDeg, decDeg: skymap.peakDecDeg },
    warnings: skymap.warnings,
    distance: skymap.distance ?? null,
    createdAt: skymap.createdAt.toISOString(),
    file: { uploadId: upload.id, name: upload.name, sha256: upload.sha256, sizeBytes: upload.sizeBytes, url: uploadUrl(upload.id) },
    uploadedBy: uploader?.id ? uploader : null,
  };
}

/** A candidate's sky maps, newest first (the first is the one shown and used for visibility). */
export async function listCandidateSkymaps(candidateId: string): Promise<SkymapInfo[]> {
  return (await selectSkymaps(eq(skymaps.candidateId, candidateId), 100)).map(toInfo);
}

export async function getSkymap(id: string): Promise<SkymapInfo> {
  const [row] = await selectSkymaps(eq(skymaps.id, id), 1);
  if (!row) throw new ApiError(404, "sky map not found");
  return toInfo(row);
}

/**
 * Probability inside a cone at the map's native resolution: the stored FITS file is re-read (once per process,
 * then kept in a SkymapCache keyed by sha256). Pixel-centre inclusion, as lib/skymap/cone.ts explains.
 */
export async function skymapConeProbability(id: string, raDeg: number, decDeg: number, radiusDeg: number): Promise<number> {
  const info = await getSkymap(id);
  const map = readSkymapMap(info.file.sha256);
  return coneProbability(map, raDeg % 360, decDeg, radiusDeg);
}

/**
 * Distance (mean and sd of the Singer et al. 2016 ansatz) in the map's pixel holding a position; null where that
 * pixel carries no distance or a multi-order map has no pixel. 409 for a map without distance columns.
 */
export async function skymapDistanceAt(id: string, raDeg: number, decDeg: number): Promise<{ meanMpc: number; stdMpc: number } | null> {
  const info = await getSkymap(id);
  const map = readSkymapMap(info.file.sha256);
  if (!map.distance) throw new ApiError(409, "this sky map has no distance columns (DISTMU, DISTSIGMA, DISTNORM)");
  const index = pixelLocator(map)(raDeg, decDeg);
  const moments = index < 0 ? null : pixelDistance(map.distance, index);
  return moments ? { meanMpc: moments.meanMpc, stdMpc: moments.stdMpc } : null;
}

/** The parsed map of a stored sky map at native resolution (plans, coverage, cones, searched regions): the FITS file is read once per process, then kept in the SkymapCache keyed by sha256. */
export function readSkymapMap(sha256: string): SkymapMap {
  return mapCache.get(sha256, () => loadSkymap(readFileSync(storedPath(sha256)), { maxBytes: maxSkymapBytes }).map);
}

/** The stored display grid's bytes (HPXG); rebuilt from the FITS file if the derived file went missing. */
export async function readDisplayGridBytes(sha256: string): Promise<Uint8Array> {
  if (await storedExists(sha256, DISPLAY_GRID_SUFFIX)) return new Uint8Array(await readStored(sha256, DISPLAY_GRID_SUFFIX));
  const map = readSkymapMap(sha256);
  const bytes = encodeDisplayGrid(toDisplayGrid(map, DISPLAY_NSIDE));
  await storeDerived(sha256, DISPLAY_GRID_SUFFIX, bytes);
  return bytes;
}

/** The decoded display grid of a stored map (drawing, contours, region samples), cached per process. */
export async function readDisplayGrid(sha256: string): Promise<DisplayGrid> {
  const hit = gridCache.get(sha256);
  if (hit) return hit;
  const grid = decodeDisplayGrid(await readDisplayGridBytes(sha256));
  gridCache.set(sha256, grid);
  if (gridCache.size > GRID_CACHE_ENTRIES) {
    const oldest = gridCache.keys().next().value;
    if (oldest !== undefined) gridCache.delete(oldest);
  }
  return grid;
}
