import { createHash, randomUUID } from "node:crypto";
import { existsSync } from "node:fs";
import { mkdir, readFile, rename, rm, stat, writeFile } from "node:fs/promises";
import path from "node:path";
import { config } from "@/lib/env";

/**
 * A content-addressed file store under UPLOAD_DIR (default ./data/uploads): every file lives at
 * `<root>/<aa>/<bb>/<sha256>`, written to a temporary file first and renamed into place, so a reader never
 * sees half a file and two uploads of the same bytes share one copy. Derived files (e.g. a sky map's display
 * grid) sit beside their source as `<sha256>.<suffix>`.
 */
export interface StoredFile {
  sha256: string;
  sizeBytes: number;
  /** False when an identical file was already stored (deduplicated). */
  created: boolean;
}

const SHA256_HEX = /^[0-9a-f]{64}$/;
const SUFFIX = /^[a-z0-9-]{1,20}$/;

/** The store's root folder (UPLOAD_DIR), looked up on each call so a test's configuration can point it elsewhere. */
export function uploadRoot(): string {
  return path.resolve(/*turbopackIgnore: true*/ config().UPLOAD_DIR);
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Where a file with this hash lives (whether or not it exists yet). */
export function storedPath(sha256: string, suffix?: string): string {
  if (!SHA256_HEX.test(sha256)) throw new Error(`not a sha256 hex digest: ${sha256}`);
  if (suffix !== undefined && !SUFFIX.test(suffix)) throw new Error(`bad derived-file suffix: ${suffix}`);
  const name = suffix ? `${sha256}.${suffix}` : sha256;
  return path.join(/*turbopackIgnore: true*/ uploadRoot(), sha256.slice(0, 2), sha256.slice(2, 4), name);
}

/** Stores bytes under their sha256; an existing identical file is kept and reported as not created. */
export async function storeBytes(bytes: Uint8Array): Promise<StoredFile> {
  const sha256 = sha256Hex(bytes);
  const created = await writeAtomically(storedPath(sha256), bytes);
  return { sha256, sizeBytes: bytes.byteLength, created };
}

/** Stores a file derived from the one with `sha256` (same content for the same source, so also deduplicated). */
export async function storeDerived(sha256: string, suffix: string, bytes: Uint8Array): Promise<boolean> {
  return writeAtomically(storedPath(sha256, suffix), bytes);
}

export async function readStored(sha256: string, suffix?: string): Promise<Buffer> {
  return readFile(storedPath(sha256, suffix));
}

export async function storedExists(sha256: string, suffix?: string): Promise<boolean> {
  try {
    return (await stat(storedPath(sha256, suffix))).isFile();
  } catch {
    return false;
  }
}

/** Removes a stored file (and nothing else); missing files are fine. */
export async function removeStored(sha256: string, suffix?: string): Promise<void> {
  await rm(storedPath(sha256, suffix), { force: true });
}

async function writeAtomically(target: string, bytes: Uint8Array): Promise<boolean> {
  if (existsSync(target)) return false;
  const tmpDir = path.join(uploadRoot(), "tmp");
  await mkdir(tmpDir, { recursive: true });
  await mkdir(path.dirname(target), { recursive: true });
  const tmp = path.join(tmpDir, `${randomUUID()}.part`);
  try {
    await writeFile(tmp, bytes, { flag: "wx" });
    // rename within one file system is atomic; a concurrent writer of the same bytes simply replaces an identical file
    await rename(tmp, target);
  } catch (error) {
    await rm(tmp, { force: true });
    throw error;
  }
  return true;
}
