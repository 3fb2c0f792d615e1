import { getDb } from "@/db";
import type { Catalogue } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import {
  appendGalaxies,
  findDefaultCatalogue,
  GALAXY_BATCH_ROWS,
  insertGalaxyPacks,
  insertImportingCatalogue,
  markCatalogueReady,
  removeCatalogue,
  type GalaxyBatch,
} from "@/lib/data/catalogues";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { cellOfFine, fineNestedIndex } from "@/lib/galaxies/cell";
import { CellPacker } from "@/lib/galaxies/pack";
import { streamLines } from "@/lib/storage/lines";
import { streamMultipart } from "@/lib/storage/multipart-stream";
import {
  catalogueNameSchema,
  MAX_CATALOGUE_BYTES,
  MAX_CATALOGUE_LINE_CHARS,
  MAX_CATALOGUE_ROWS,
  parseCatalogueHeader,
  parseCatalogueRow,
  type CatalogueColumn,
  type CatalogueProblem,
} from "@/lib/validations/catalogues";

export interface ImportedCatalogue {
  id: string;
  name: string;
  rows: number;
}

export interface ImportOptions {
  now: Date;
  maxFileBytes?: number;
  maxRows?: number;
  /** galaxies held before their ranking packs are written; PACK_FLUSH_ROWS unless a test says otherwise */
  packFlushRows?: number;
}

const rowProblem = (p: CatalogueProblem) =>
  new ApiError(422, `row ${p.row}${p.row > 0 ? ` (line ${p.row + 1})` : " (the header)"}, column ${p.column}: ${p.message}`, {
    row: p.row,
    column: p.column,
    issues: [{ path: `row ${p.row}.${p.column}`, message: p.message }],
  });

/**
 * Imports an uploaded catalogue (multipart field `file`, CSV; optional field `name`) while it streams in: the
 * catalogue row is made `importing`, rows go in batches of GALAXY_BATCH_ROWS, each its own short write transaction
 * (so other writers are never held up for the whole upload), their ranking packs every PACK_FLUSH_ROWS, and the
 * row turns `ready` at the end. Any refusal
 * (a bad row, a limit, a broken body) deletes the catalogue with every row written so far: nothing is kept.
 * The first catalogue becomes the default.
 */
export async function importCatalogue(actor: SessionUser, req: Request, options: ImportOptions): Promise<ImportedCatalogue> {
  return withImportingCatalogue(actor.id, options.now, async (created) => {
    const { fields, result } = await streamMultipart(req, {
      fileField: "file",
      maxFileBytes: options.maxFileBytes ?? MAX_CATALOGUE_BYTES,
      onFile: async (file) => ({ rows: await importRows(created, file.stream, options.maxRows ?? MAX_CATALOGUE_ROWS, options.packFlushRows ?? PACK_FLUSH_ROWS), filename: file.filename }),
    });
    const named = catalogueNameSchema.safeParse(fields.name ?? (result.filename.replace(/\.[^.]*$/, "") || "catalogue"));
    if (!named.success) throw new ApiError(422, `invalid field name: ${named.error.issues[0]?.message ?? "invalid"}`, { issues: [{ path: "name", message: named.error.issues[0]?.message ?? "invalid" }] });
    return { rows: result.rows, name: named.data };
  });
}

/** A catalogue from CSV bytes that are not an upload (the demo seed, scripts): same checks, no uploader. */
export async function importCatalogueCsv(csv: AsyncIterable<Uint8Array>, options: { name: string; now: Date }): Promise<ImportedCatalogue> {
  const name = catalogueNameSchema.parse(options.name);
  return withImportingCatalogue(null, options.now, async (created) => ({ rows: await importRows(created, csv, MAX_CATALOGUE_ROWS, PACK_FLUSH_ROWS), name }));
}

/**
 * Makes the catalogue row (`importing`), lets `fill` write its galaxies, then marks it ready (the default if there
 * is none yet) with an audit event; on any failure removes it and everything written for it.
 */
async function withImportingCatalogue(
  uploadedById: string | null,
  now: Date,
  fill: (created: Catalogue) => Promise<{ rows: number; name: string }>,
): Promise<ImportedCatalogue> {
  const db = await getDb();
  const created = await db.transaction((tx) => insertImportingCatalogue(tx, { name: "(importing)", uploadedById, now }));
  try {
    const { rows, name } = await fill(created);
    await db.transaction(async (tx) => {
      const isDefault = (await findDefaultCatalogue(tx)) === null;
      await markCatalogueReady(tx, created.id, { name, rowCount: rows, isDefault });
      await appendEvent(tx, { at: now, kind: eventKinds.catalogueChanged, actorId: uploadedById, data: { catalogueId: created.id, name, rows, action: "imported" } });
    });
    return { id: created.id, name, rows };
  } catch (error) {
    await db.transaction((tx) => removeCatalogue(tx, created.id));
    throw error;
  }
}

/** Galaxies held per cell before their ranking packs are written (4 float64s each: 8 MB), so a cell has one fragment per 250 000 rows. */
const PACK_FLUSH_ROWS = 250_000;

/** Reads the CSV line by line, checks each row, writes full batches as it goes and packs them per cell. */
async function importRows(catalogue: Catalogue, csv: AsyncIterable<Uint8Array>, maxRows: number, packFlushRows: number): Promise<number> {
  const db = await getDb();
  let columns: Record<CatalogueColumn, number> | null = null;
  let width = 0;
  let row = 0;
  let stored = 0;
  const packer = new CellPacker();
  let batch = emptyBatch();
  let fine: number[] = [];
  const flush = async () => {
    const rows = batch;
    const fines = fine;
    batch = emptyBatch();
    fine = [];
    const first = await appendGalaxies(db, catalogue.id, rows, stored + rows.name.length);
    for (let k = 0; k < rows.name.length; k++) {
      packer.add(rows.cell[k] ?? 0, first + k, fines[k] ?? 0, rows.distanceMpc[k] ?? 0, rows.weight[k] ?? 0);
    }
    stored += rows.name.length;
    if (packer.size >= packFlushRows) await insertGalaxyPacks(db, catalogue.id, packer.drain());
  };
  for await (const line of streamLines(csv, MAX_CATALOGUE_LINE_CHARS)) {
    if (columns === null) {
      const header = parseCatalogueHeader(line);
      if (!header.ok) throw rowProblem(header.problem);
      ({ columns, width } = header);
      continue;
    }
    row += 1;
    if (line.trim() === "") continue;
    if (row > maxRows) throw new ApiError(413, `a catalogue holds at most ${maxRows} rows`, { row, limitRows: maxRows });
    const parsed = parseCatalogueRow(line, columns, width, row);
    if (!parsed.ok) throw rowProblem(parsed.problem);
    const g = parsed.row;
    const at = fineNestedIndex(g.raDeg, g.decDeg);
    fine.push(at);
    batch.cell.push(cellOfFine(at));
    batch.name.push(g.name);
    batch.raDeg.push(g.raDeg);
    batch.decDeg.push(g.decDeg);
    batch.distanceMpc.push(g.distanceMpc);
    batch.weight.push(g.weight);
    if (batch.name.length >= GALAXY_BATCH_ROWS) await flush();
  }
  if (columns === null) throw rowProblem({ row: 0, column: "file", message: "the file is empty: give the header name,raDeg,decDeg,distanceMpc,weight and at least one galaxy" });
  if (stored + batch.name.length === 0) throw rowProblem({ row: 1, column: "file", message: "the file has a header but no galaxies" });
  if (batch.name.length) await flush();
  await insertGalaxyPacks(db, catalogue.id, packer.drain());
  return stored;
}

function emptyBatch(): GalaxyBatch {
  return { cell: [], name: [], raDeg: [], decDeg: [], distanceMpc: [], weight: [] };
}
