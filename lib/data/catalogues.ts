import { count, desc, eq, sql } from "drizzle-orm";
import type { Database, Tx } from "@/db";
import { catalogues, galaxies, type Catalogue } from "@/db/schema";

/** Storage of galaxy catalogues: queries only; the services decide what a missing row means. */

export async function insertImportingCatalogue(tx: Tx, values: { name: string; uploadedById: string | null; now: Date }): Promise<Catalogue> {
  const [row] = await tx.insert(catalogues).values({ name: values.name, state: "importing", uploadedById: values.uploadedById, createdAt: values.now }).returning();
  if (!row) throw new Error("catalogue insert returned nothing");
  return row;
}

export async function setCatalogueRowCount(tx: Tx, id: string, rowCount: number): Promise<void> {
  await tx.update(catalogues).set({ rowCount }).where(eq(catalogues.id, id));
}

export async function markCatalogueReady(tx: Tx, id: string, values: { name: string; rowCount: number; isDefault: boolean }): Promise<void> {
  await tx.update(catalogues).set({ state: "ready", ...values }).where(eq(catalogues.id, id));
}

/** Removes a catalogue; its galaxies go with it (ON DELETE CASCADE over the (catalogue, cell) index). */
export async function removeCatalogue(tx: Tx, id: string): Promise<void> {
  await tx.delete(catalogues).where(eq(catalogues.id, id));
}

export async function findCatalogue(tx: Tx, id: string): Promise<Catalogue | null> {
  const [row] = await tx.select().from(catalogues).where(eq(catalogues.id, id)).limit(1);
  return row ?? null;
}

export async function findDefaultCatalogue(tx: Tx): Promise<Catalogue | null> {
  const [row] = await tx.select().from(catalogues).where(eq(catalogues.isDefault, true)).limit(1);
  return row ?? null;
}

/** Newest first; importing ones too (their rowCount is how far they got). */
export async function listCatalogues(tx: Tx): Promise<Catalogue[]> {
  return tx.select().from(catalogues).orderBy(desc(catalogues.createdAt), desc(catalogues.id));
}

export async function newestReadyCatalogue(tx: Tx, exceptId?: string): Promise<Catalogue | null> {
  const rows = await tx.select().from(catalogues).where(eq(catalogues.state, "ready")).orderBy(desc(catalogues.createdAt), desc(catalogues.id)).limit(2);
  return rows.find((r) => r.id !== exceptId) ?? null;
}

/** Makes one catalogue the default: the old default is cleared first (the unique partial index allows one). */
export async function setDefaultCatalogue(tx: Tx, id: string): Promise<void> {
  await tx.update(catalogues).set({ isDefault: false }).where(eq(catalogues.isDefault, true));
  await tx.update(catalogues).set({ isDefault: true }).where(eq(catalogues.id, id));
}

export async function renameCatalogue(tx: Tx, id: string, name: string): Promise<void> {
  await tx.update(catalogues).set({ name }).where(eq(catalogues.id, id));
}

export async function countGalaxies(tx: Tx, catalogueId: string): Promise<number> {
  const [row] = await tx.select({ n: count() }).from(galaxies).where(eq(galaxies.catalogueId, catalogueId));
  return row?.n ?? 0;
}

/** Galaxies of one import batch, as parallel arrays. */
export interface GalaxyBatch {
  cell: number[];
  name: string[];
  raDeg: number[];
  decDeg: number[];
  distanceMpc: number[];
  weight: number[];
}

/** Rows per batch: 8 bound values each stay under SQLite's 32 766 variables. */
export const GALAXY_BATCH_ROWS = 2_000;
const PACK_BATCH_ROWS = 500;

/**
 * Appends one batch in its own write transaction through the libSQL client (a multi-row INSERT: the query builder
 * costs more than SQLite for millions of rows). Ids are taken as a block after the largest, inside the
 * transaction, so the caller knows them for the ranking packs. Returns the first id; the catalogue's row count
 * becomes `rowCount`.
 */
export async function appendGalaxies(db: Database, catalogueId: string, batch: GalaxyBatch, rowCount: number): Promise<number> {
  const n = batch.name.length;
  const tx = await db.$client.transaction("write");
  try {
    const top = await tx.execute("SELECT coalesce(max(id), 0) AS top FROM galaxies");
    const first = Number(top.rows[0]?.top ?? 0) + 1;
    const args: Array<string | number> = [];
    for (let k = 0; k < n; k++) {
      args.push(first + k, catalogueId, batch.cell[k] ?? 0, batch.name[k] ?? "", batch.raDeg[k] ?? 0, batch.decDeg[k] ?? 0, batch.distanceMpc[k] ?? 0, batch.weight[k] ?? 0);
    }
    const values = Array.from({ length: n }, () => "(?,?,?,?,?,?,?,?)").join(",");
    await tx.execute({ sql: `INSERT INTO galaxies (id, catalogue_id, cell, name, ra_deg, dec_deg, distance_mpc, weight) VALUES ${values}`, args });
    await tx.execute({ sql: "UPDATE catalogues SET row_count = ? WHERE id = ?", args: [rowCount, catalogueId] });
    await tx.commit();
    return first;
  } finally {
    tx.close();
  }
}

/** Writes ranking packs (one row per cell fragment) in one write transaction. */
export async function insertGalaxyPacks(db: Database, catalogueId: string, packs: ReadonlyArray<{ cell: number; count: number; data: Uint8Array }>): Promise<void> {
  if (!packs.length) return;
  const tx = await db.$client.transaction("write");
  try {
    for (let at = 0; at < packs.length; at += PACK_BATCH_ROWS) {
      const part = packs.slice(at, at + PACK_BATCH_ROWS);
      await tx.execute({
        sql: `INSERT INTO galaxy_cells (catalogue_id, cell, count, data) VALUES ${part.map(() => "(?,?,?,?)").join(",")}`,
        args: part.flatMap((p) => [catalogueId, p.cell, p.count, p.data]),
      });
    }
    await tx.commit();
  } finally {
    tx.close();
  }
}

/** The ranking packs of a catalogue in the given index cells: one index seek per cell, a few rows each. */
export async function packsInCells(db: Database, catalogueId: string, cells: readonly number[]): Promise<Array<{ count: number; data: Uint8Array }>> {
  if (!cells.length) return [];
  const result = await db.$client.execute({
    sql: "SELECT count, data FROM galaxy_cells WHERE catalogue_id = ? AND cell IN (SELECT value FROM json_each(?)) ORDER BY cell, id",
    args: [catalogueId, JSON.stringify(cells)],
  });
  return result.rows.map((row) => ({ count: Number(row.count), data: new Uint8Array(row.data as ArrayBuffer) }));
}

export interface GalaxyRecord {
  id: number;
  name: string;
  raDeg: number;
  decDeg: number;
  distanceMpc: number;
  weight: number;
}

/** Galaxies by id (the few a ranking keeps), as stored. */
export async function galaxiesById(tx: Tx, ids: readonly number[]): Promise<Map<number, GalaxyRecord>> {
  if (!ids.length) return new Map();
  const rows = await tx
    .select({ id: galaxies.id, name: galaxies.name, raDeg: galaxies.raDeg, decDeg: galaxies.decDeg, distanceMpc: galaxies.distanceMpc, weight: galaxies.weight })
    .from(galaxies)
    .where(sql`${galaxies.id} IN (SELECT value FROM json_each(${JSON.stringify(ids)}))`);
  return new Map(rows.map((r) => [r.id, r]));
}

export async function hasGalaxyPacks(db: Database, catalogueId: string): Promise<boolean> {
  const result = await db.$client.execute({ sql: "SELECT 1 FROM galaxy_cells WHERE catalogue_id = ? LIMIT 1", args: [catalogueId] });
  return result.rows.length > 0;
}

/** A page of a catalogue's galaxies in id order after `afterId` (for building packs of an older import). */
export async function galaxyPage(db: Database, catalogueId: string, afterId: number, limit: number): Promise<GalaxyRecord[]> {
  const result = await db.$client.execute({
    sql: "SELECT id, ra_deg, dec_deg, distance_mpc, weight FROM galaxies WHERE catalogue_id = ? AND id > ? ORDER BY id LIMIT ?",
    args: [catalogueId, afterId, limit],
  });
  return result.rows.map((r) => ({ id: Number(r.id), name: "", raDeg: Number(r.ra_deg), decDeg: Number(r.dec_deg), distanceMpc: Number(r.distance_mpc), weight: Number(r.weight) }));
}
