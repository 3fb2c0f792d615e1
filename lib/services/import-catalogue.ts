import { getDb } from "@/db";
import type { Catalogue, NewGalaxy } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import {
  findDefaultCatalogue,
  GALAXY_BATCH_ROWS,
  insertGalaxies,
  insertImportingCatalogue,
  markCatalogueReady,
  removeCatalogue,
  setCatalogueRowCount,
} from "@/lib/data/catalogues";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { galaxyCell } from "@/lib/galaxies/cell";
import { streamLines } from "@/lib/storage/lines";
import { streamMultipart, type StreamedFile } from "@/lib/storage/multipart-stream";
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
 * (so other writers are never held up for the whole upload), and the row turns `ready` at the end. Any refusal
 * (a bad row, a limit, a broken body) deletes the catalogue with every row written so far: nothing is kept.
 * The first catalogue becomes the default.
 */
export async function importCatalogue(actor: SessionUser, req: Request, options: ImportOptions): Promise<ImportedCatalogue> {
  const db = await getDb();
  const created = await db.transaction((tx) => insertImportingCatalogue(tx, { name: "(importing)", uploadedById: actor.id, now: options.now }));
  try {
    const { fields, result } = await streamMultipart(req, {
      fileField: "file",
      maxFileBytes: options.maxFileBytes ?? MAX_CATALOGUE_BYTES,
      onFile: (file) => importRows(created, file, options.maxRows ?? MAX_CATALOGUE_ROWS),
    });
    const named = catalogueNameSchema.safeParse(fields.name ?? result.filename.replace(/\.[^.]*$/, "") ?? "catalogue");
    if (!named.success) throw new ApiError(422, `invalid field name: ${named.error.issues[0]?.message ?? "invalid"}`, { issues: [{ path: "name", message: named.error.issues[0]?.message ?? "invalid" }] });
    const name = named.data;
    await db.transaction(async (tx) => {
      const isDefault = (await findDefaultCatalogue(tx)) === null;
      await markCatalogueReady(tx, created.id, { name, rowCount: result.rows, isDefault });
      await appendEvent(tx, { at: options.now, kind: eventKinds.catalogueChanged, actorId: actor.id, data: { catalogueId: created.id, name, rows: result.rows, action: "imported" } });
    });
    return { id: created.id, name, rows: result.rows };
  } catch (error) {
    await db.transaction((tx) => removeCatalogue(tx, created.id));
    throw error;
  }
}

/** Reads the CSV line by line, checks each row, and writes full batches as it goes. */
async function importRows(catalogue: Catalogue, file: StreamedFile, maxRows: number): Promise<{ rows: number; filename: string }> {
  const db = await getDb();
  let columns: Record<CatalogueColumn, number> | null = null;
  let width = 0;
  let row = 0;
  let stored = 0;
  let batch: NewGalaxy[] = [];
  const flush = async () => {
    const rows = batch;
    batch = [];
    stored += rows.length;
    await db.transaction(async (tx) => {
      await insertGalaxies(tx, rows);
      await setCatalogueRowCount(tx, catalogue.id, stored);
    });
  };
  for await (const line of streamLines(file.stream, MAX_CATALOGUE_LINE_CHARS)) {
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
    batch.push({ catalogueId: catalogue.id, cell: galaxyCell(g.raDeg, g.decDeg), name: g.name, raDeg: g.raDeg, decDeg: g.decDeg, distanceMpc: g.distanceMpc, weight: g.weight });
    if (batch.length >= GALAXY_BATCH_ROWS) await flush();
  }
  if (columns === null) throw rowProblem({ row: 0, column: "file", message: "the file is empty: give the header name,raDeg,decDeg,distanceMpc,weight and at least one galaxy" });
  if (stored + batch.length === 0) throw rowProblem({ row: 1, column: "file", message: "the file has a header but no galaxies" });
  if (batch.length) await flush();
  return { rows: stored, filename: file.filename };
}
