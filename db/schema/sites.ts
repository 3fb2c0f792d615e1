import { primaryKey, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { createdAt, idColumn } from "./columns";
import { users } from "./users";

export const sites = sqliteTable(
  "sites",
  {
    id: idColumn(),
    code: text("code").notNull(),
    name: text("name").notNull(),
    latitudeDeg: real("latitude_deg").notNull(),
    longitudeDeg: real("longitude_deg").notNull(),
    elevationM: real("elevation_m").notNull(),
    minAltitudeDeg: real("min_altitude_deg").notNull().default(30),
    /** The least angle between a pointing and the Moon the site accepts (plans schedule nothing closer); the default is lib/astro DEFAULT_MOON_DISTANCE_DEG. */
    moonDistanceDeg: real("moon_distance_deg").notNull().default(20),
    fieldOfViewDeg2: real("field_of_view_deg2").notNull(),
    timeZone: text("time_zone").notNull().default("UTC"),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("sites_code_unique").on(t.code)],
);
export type Site = typeof sites.$inferSelect;
export type NewSite = typeof sites.$inferInsert;

export const siteObservers = sqliteTable(
  "site_observers",
  {
    siteId: text("site_id")
      .notNull()
      .references(() => sites.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
  },
  (t) => [primaryKey({ columns: [t.siteId, t.userId] })],
);
