import { cpSync, existsSync, mkdirSync, readdirSync, statSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";

/** The file behind a `file:` URL, or null for a libSQL server (which keeps its own backups). */
export function databaseFile(url: string): string | null {
  if (!url.startsWith("file:")) return null;
  const file = url.slice("file:".length).replace(/^\/\/(?=\/)/, "");
  return file === ":memory:" ? null : path.resolve(file);
}

/** "2026-12-03T09-50-12-345Z": sortable, and safe in a file name on every system. */
export function backupStamp(at: Date): string {
  return at.toISOString().replace(/[:.]/g, "-");
}

export interface BackupResult {
  databaseFile: string;
  uploadsDir: string | null;
  bytes: number;
}

/**
 * A consistent copy of a running database: SQLite's VACUUM INTO writes the database as one read transaction sees
 * it (https://sqlite.org/lang_vacuum.html#vacuuminto), so writers in other processes go on (WAL) and the copy holds
 * every transaction committed before it began and none half-done. Uploads are content-addressed and never
 * rewritten, so copying the folder after the database copy covers every file the copy refers to.
 */
export async function backupDatabase(url: string, uploadDir: string, outDir: string, now = new Date()): Promise<BackupResult> {
  const source = databaseFile(url);
  if (!source) throw new Error(`db:backup copies an embedded file database; ${url} is a server (use its own backups)`);
  if (!existsSync(source)) throw new Error(`no database at ${source}`);
  mkdirSync(outDir, { recursive: true });
  const base = path.join(path.resolve(outDir), `chirpdesk-${backupStamp(now)}`);
  const target = `${base}.db`;
  const client = createClient({ url: `file:${source}`, timeout: 10_000 });
  try {
    await client.execute({ sql: "VACUUM INTO ?", args: [target] });
  } finally {
    client.close();
  }
  let uploadsDir: string | null = null;
  if (existsSync(uploadDir) && readdirSync(uploadDir).length > 0) {
    uploadsDir = `${base}.uploads`;
    cpSync(uploadDir, uploadsDir, { recursive: true, errorOnExist: false });
  }
  return { databaseFile: target, uploadsDir, bytes: statSync(target).size };
}

/**
 * Puts a backup in place of an absent database (a fresh installation, or one moved aside): refuses to overwrite an
 * existing file, copies the uploads saved beside the backup into the upload folder. Migrations run afterwards.
 */
export function restoreDatabase(backupFile: string, url: string, uploadDir: string): { databaseFile: string; uploads: boolean } {
  const target = databaseFile(url);
  if (!target) throw new Error(`db:restore writes an embedded file database; ${url} is a server`);
  const from = path.resolve(backupFile);
  if (!existsSync(from)) throw new Error(`no backup at ${from}`);
  for (const existing of [target, `${target}-wal`]) {
    if (existsSync(existing)) throw new Error(`${existing} exists; move it aside first (restore never overwrites a database)`);
  }
  mkdirSync(path.dirname(target), { recursive: true });
  cpSync(from, target);
  const savedUploads = from.replace(/\.db$/, ".uploads");
  const uploads = savedUploads !== from && existsSync(savedUploads);
  if (uploads) cpSync(savedUploads, uploadDir, { recursive: true, errorOnExist: false, force: false });
  return { databaseFile: target, uploads };
}
