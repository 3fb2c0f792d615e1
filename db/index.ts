import { config } from "@/lib/env";
import { openDatabase, type Database } from "./client";

export type { Database } from "./client";
export type { Tx } from "./tx";
export { isDatabaseBusy, isUniqueViolation } from "./errors";

interface DbCache {
  url: string;
  db: Promise<Database>;
}

// One client per process, kept across hot reloads in development.
const globalForDb = globalThis as unknown as { chirpdeskDb?: DbCache };

/** The process's database, opened on first use from DATABASE_URL. */
export function getDb(): Promise<Database> {
  const { DATABASE_URL: url, DATABASE_AUTH_TOKEN: authToken, DATABASE_BUSY_WAIT_MS: waitMs } = config();
  const cached = globalForDb.chirpdeskDb;
  if (cached && cached.url === url) return cached.db;
  const db = openDatabase(url, authToken, { waitMs });
  globalForDb.chirpdeskDb = { url, db };
  db.catch(() => {
    if (globalForDb.chirpdeskDb?.db === db) globalForDb.chirpdeskDb = undefined;
  });
  return db;
}

/** Closes the process's client (tests and scripts). */
export async function closeDb(): Promise<void> {
  const cached = globalForDb.chirpdeskDb;
  globalForDb.chirpdeskDb = undefined;
  if (cached) (await cached.db).$client.close();
}
