import { sqliteTable, text } from "drizzle-orm/sqlite-core";
import { instant } from "./columns";
import { users } from "./users";

/** Coordinator settings (physics thresholds, deadlines, escalation policy), one JSON value per key. */
export const settings = sqliteTable("settings", {
  key: text("key").primaryKey(),
  value: text("value", { mode: "json" }).$type<unknown>().notNull(),
  updatedAt: instant("updated_at").notNull(),
  updatedById: text("updated_by_id").references(() => users.id, { onDelete: "set null" }),
});
