import path from "node:path";
import { migrate } from "drizzle-orm/libsql/migrator";
import type { Database } from "./client";

export const migrationsFolder = path.resolve(process.cwd(), "drizzle");

/** Applies committed migrations; safe when two processes start at once (the loser waits, then finds none due). */
export async function migrateDatabase(db: Database, folder = migrationsFolder): Promise<void> {
  for (let attempt = 1; ; attempt++) {
    try {
      await migrate(db, { migrationsFolder: folder });
      return;
    } catch (error) {
      const busy = /SQLITE_BUSY|database is locked|already exists/i.test(String(error));
      if (!busy || attempt >= 5) throw error;
      await new Promise((r) => setTimeout(r, 200 * attempt));
    }
  }
}
