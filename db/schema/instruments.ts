import { index, integer, real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn } from "./columns";
import { sites } from "./sites";

/** A footprint on the sky: a north-up rectangle (gnomonic tangent-plane sides) or a circle. */
export type Footprint = { shape: "rectangle"; widthDeg: number; heightDeg: number } | { shape: "circle"; radiusDeg: number };

/** A camera or spectrograph at a site; a site may have several. */
export const instruments = sqliteTable(
  "instruments",
  {
    id: idColumn(),
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    footprint: text("footprint", { mode: "json" }).$type<Footprint>().notNull(),
    filters: text("filters", { mode: "json" }).$type<string[]>().notNull(),
    exposureS: integer("exposure_s").notNull(),
    overheadS: integer("overhead_s").notNull(),
    limitingMag: real("limiting_mag"),
    createdAt: createdAt(),
  },
  (t) => [index("instruments_site_idx").on(t.siteId)],
);
export type Instrument = typeof instruments.$inferSelect;
