/**
 * SQLite failures the product reacts to, recognised once. Drizzle wraps the driver's error, so the message and
 * code of every cause in the chain are read.
 */
function describeChain(error: unknown): string {
  const parts: string[] = [];
  for (let e = error; e && parts.length < 5; e = (e as { cause?: unknown }).cause) {
    parts.push(`${String(e)} ${String((e as { code?: unknown }).code ?? "")}`);
  }
  return parts.join(" | ");
}

/** A UNIQUE or PRIMARY KEY constraint refused the write (two writers raced for the same key). */
export function isUniqueViolation(error: unknown): boolean {
  return /UNIQUE constraint failed|SQLITE_CONSTRAINT_(UNIQUE|PRIMARYKEY)/.test(describeChain(error));
}

/**
 * Another process held the file's write lock past the busy wait, or this process's queue of writes did not move
 * (db/write-queue.ts); the caller may retry shortly.
 */
export function isDatabaseBusy(error: unknown): boolean {
  return /SQLITE_BUSY|database is locked|database is busy/.test(describeChain(error));
}
