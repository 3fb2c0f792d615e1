import { mkdirSync } from "node:fs";
import path from "node:path";
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import * as schema from "./schema";
import { serialiseWrites } from "./write-queue";

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

/** Milliseconds a writer waits for another process's lock before giving up. */
const BUSY_TIMEOUT_MS = 10_000;

function localPath(url: string): string | null {
  if (!url.startsWith("file:")) return null;
  return url.slice("file:".length).replace(/^\/\/(?=\/)/, "");
}

/**
 * Opens the embedded file (creating its folder) or a libSQL server URL with the same client.
 * File databases get WAL (kept in the file itself), a busy timeout on every pooled connection, and one write at a
 * time within the process (db/write-queue.ts explains why).
 */
export async function openDatabase(url: string, authToken?: string): Promise<Database> {
  const file = localPath(url);
  if (file && file !== ":memory:") mkdirSync(path.dirname(path.resolve(/*turbopackIgnore: true*/ file)), { recursive: true });
  const raw = createClient({ url, authToken, timeout: BUSY_TIMEOUT_MS });
  if (file) {
    await raw.execute("PRAGMA journal_mode = WAL");
    await raw.execute("PRAGMA foreign_keys = ON");
  }
  const client = file ? serialiseWrites(raw) : raw;
  return drizzle(client, { schema }) as Database;
}
