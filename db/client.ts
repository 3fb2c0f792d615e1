import { mkdirSync } from "node:fs";
import path from "node:path";
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import * as schema from "./schema";
import { retryWhenBusy, type BusyWait } from "./busy-retry";
import { serialiseWrites } from "./write-queue";

export type Database = LibSQLDatabase<typeof schema> & { $client: Client };

/**
 * The driver's own busy timeout, which it sits out on the event-loop thread: kept short, so a write waiting for
 * another process's lock stalls nothing else; db/busy-retry.ts does the longer waiting on timers.
 */
const DRIVER_BUSY_TIMEOUT_MS = 20;
/** How long a write waits for another process's lock in all, unless the configuration says otherwise. */
export const DEFAULT_BUSY_WAIT_MS = 10_000;

function localPath(url: string): string | null {
  if (!url.startsWith("file:")) return null;
  return url.slice("file:".length).replace(/^\/\/(?=\/)/, "");
}

/**
 * Opens the embedded file (creating its folder) or a libSQL server URL with the same client.
 * File databases get WAL (kept in the file itself), waiting for a locked file on timers with the pool reopened after
 * every busy answer (db/busy-retry.ts), and one write at a time within the process (db/write-queue.ts explains why).
 * A write still locked out after `busy.waitMs` fails with SQLITE_BUSY, which routes answer as 503.
 */
export async function openDatabase(url: string, authToken?: string, busy: BusyWait = { waitMs: DEFAULT_BUSY_WAIT_MS }): Promise<Database> {
  const file = localPath(url);
  if (file && file !== ":memory:") mkdirSync(path.dirname(path.resolve(/*turbopackIgnore: true*/ file)), { recursive: true });
  const raw = createClient({ url, authToken, timeout: file ? DRIVER_BUSY_TIMEOUT_MS : DEFAULT_BUSY_WAIT_MS });
  if (file) {
    // On the raw client, before any wrapper can reopen its connections: WAL is a property of the file; foreign keys
    // are on by default in this driver on every connection it opens, and this keeps it so on the first.
    await raw.execute("PRAGMA journal_mode = WAL");
    await raw.execute("PRAGMA foreign_keys = ON");
  }
  const client = file ? serialiseWrites(retryWhenBusy(raw, busy)) : raw;
  return drizzle(client, { schema }) as Database;
}
