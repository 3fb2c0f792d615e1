/**
 * One writer at a time inside this process.
 *
 * The embedded libSQL driver runs each statement synchronously and waits out a locked database (busy timeout) on
 * the event-loop thread. If a second write starts while this process's own write transaction is between two
 * awaited statements, it blocks the very loop the first one needs to finish: both stall until the timeout and one
 * fails with SQLITE_BUSY. Queuing writes here prevents that; across processes SQLite's own lock still serialises.
 */
const globalForLock = globalThis as unknown as { chirpdeskWriteQueue?: Promise<unknown> };

export function withWriteLock<T>(fn: () => Promise<T>): Promise<T> {
  const previous = globalForLock.chirpdeskWriteQueue ?? Promise.resolve();
  const run = previous.then(() => fn());
  // The queue carries on whether this write succeeded or not.
  globalForLock.chirpdeskWriteQueue = run.catch(() => undefined);
  return run;
}
