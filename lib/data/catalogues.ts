import { and, count, desc, eq, sql } from "drizzle-orm";
import type { Tx } from "@/db";
import { catalogues, galaxies, type Catalogue, type NewGalaxy } from "@/db/schema";

/** Storage of galaxy catalogues: queries only; the services decide what a missing row means. */

export async function insertImportingCatalogue(tx: Tx, values: { name: string; uploadedById: string; now: Date }): Promise<Catalogue> {
  const [row] = await tx.insert(catalogues).values({ name: values.name, state: "importing", uploadedById: values.uploadedById, createdAt: values.now }).returning();
  if (!row) throw new Error("catalogue insert returned nothing");
  return row;
}

/** One batch of galaxies (at most GALAXY_BATCH_ROWS: 7 bound values each stay under SQLite's 32 766). */
export async function insertGalaxies(tx: Tx, rows: NewGalaxy[]): Promise<void> {
  if (rows.length) await tx.insert(galaxies).values(rows);
}
export const GALAXY_BATCH_ROWS = 2_000;

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

export interface GalaxyRow {
  name: string;
  raDeg: number;
  decDeg: number;
  distanceMpc: number;
  weight: number;
}

/** The galaxies of a catalogue in the given index cells (one seek per cell on the (catalogue, cell) index). */
export async function galaxiesInCells(tx: Tx, catalogueId: string, cells: readonly number[]): Promise<GalaxyRow[]> {
  if (!cells.length) return [];
  return tx
    .select({ name: galaxies.name, raDeg: galaxies.raDeg, decDeg: galaxies.decDeg, distanceMpc: galaxies.distanceMpc, weight: galaxies.weight })
    .from(galaxies)
    .where(and(eq(galaxies.catalogueId, catalogueId), sql`${galaxies.cell} IN (SELECT value FROM json_each(${JSON.stringify(cells)}))`));
}
