/**
 * Kept for existing callers: the database client itself now queues this process's writes (db/write-queue.ts),
 * which is why this wrapper no longer adds a lock of its own. A second, separate queue here would deadlock any
 * caller that nests one locked write inside another (e.g. a paging hook run inside the ingest transaction).
 * New code can call the database directly.
 */
export function withWriteLock<T>(fn: () => Promise<T>): Promise<T> {
  return fn();
}
