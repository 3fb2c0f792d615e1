import { sql } from "drizzle-orm";
import { blob, index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn } from "./columns";
import { users } from "./users";

/**
 * HEALPix order of the cell index on every galaxy: NESTED nside 64 (order 6, 49 152 cells of 0.84 deg²). A credible
 * region of 1000 deg² touches about 1 200 cells, each one index seek; nested, so a coarser cell is `cell >> 2k`.
 */
export const GALAXY_CELL_ORDER = 6;
export const GALAXY_CELL_NSIDE = 2 ** GALAXY_CELL_ORDER;

/**
 * An uploaded galaxy catalogue. `importing` while its rows stream in (in short batches, so the upload never holds
 * the write lock); a failed import deletes the row and its galaxies, and only `ready` catalogues are ranked.
 * At most one is the default (the unique partial index), which ranking uses when no catalogue is named.
 */
export const catalogues = sqliteTable(
  "catalogues",
  {
    id: idColumn(),
    name: text("name").notNull(),
    state: text("state", { enum: ["importing", "ready"] }).notNull(),
    isDefault: integer("is_default", { mode: "boolean" }).notNull().default(false),
    rowCount: integer("row_count").notNull().default(0),
    uploadedById: text("uploaded_by_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("catalogues_one_default").on(t.isDefault).where(sql`${t.isDefault} = 1`)],
);
export type Catalogue = typeof catalogues.$inferSelect;

/** One galaxy of a catalogue; the integer key is SQLite's rowid (no per-row UUID for millions of rows). */
export const galaxies = sqliteTable(
  "galaxies",
  {
    id: integer("id").primaryKey(),
    catalogueId: text("catalogue_id")
      .notNull()
      .references(() => catalogues.id, { onDelete: "cascade" }),
    /** NESTED index at GALAXY_CELL_NSIDE of the galaxy's position */
    cell: integer("cell").notNull(),
    name: text("name").notNull(),
    raDeg: real("ra_deg").notNull(),
    decDeg: real("dec_deg").notNull(),
    distanceMpc: real("distance_mpc").notNull(),
    /** luminosity or stellar-mass proxy, relative; 1 when the file gives none */
    weight: real("weight").notNull(),
  },
  (t) => [index("galaxies_catalogue_cell_idx").on(t.catalogueId, t.cell)],
);
export type Galaxy = typeof galaxies.$inferSelect;
export type NewGalaxy = typeof galaxies.$inferInsert;

/**
 * The ranking index: a catalogue's galaxies packed per index cell, so a credible region reads one row per cell and
 * fragment instead of one per galaxy. `data` is `count` records of five little-endian float64s (galaxy id, raDeg,
 * decDeg, distanceMpc, weight); a cell has one fragment per import flush (lib/galaxies/pack.ts).
 */
export const galaxyCells = sqliteTable(
  "galaxy_cells",
  {
    id: integer("id").primaryKey(),
    catalogueId: text("catalogue_id")
      .notNull()
      .references(() => catalogues.id, { onDelete: "cascade" }),
    cell: integer("cell").notNull(),
    count: integer("count").notNull(),
    data: blob("data", { mode: "buffer" }).notNull(),
  },
  (t) => [index("galaxy_cells_catalogue_cell_idx").on(t.catalogueId, t.cell)],
);
