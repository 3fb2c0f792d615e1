import { integer, text } from "drizzle-orm/sqlite-core";

/** Primary key: a random UUID made in the app, so ids never collide across processes. */
export const idColumn = () =>
  text("id")
    .primaryKey()
    .$defaultFn(() => crypto.randomUUID());

/** An instant in UTC with millisecond precision, stored as Unix milliseconds. */
export const instant = (name: string) => integer(name, { mode: "timestamp_ms" });

/** Creation instant, filled by the app (not SQLite's second-resolution clock). */
export const createdAt = () =>
  instant("created_at")
    .notNull()
    .$defaultFn(() => new Date());
