import { getDb } from "@/db";
import type { Tx } from "@/lib/data/events";

interface Pending<I, R> {
  item: I;
  resolve: (result: R) => void;
  reject: (error: unknown) => void;
}

/** Most writes folded into one transaction; bounds how long one commit holds the write lock. */
const maxBatch = 32;

/**
 * Group commit: writes that arrive while a transaction is being written share the next one, each inside its own
 * savepoint, so a burst costs one commit (one fsync) instead of one per write. A write that fails rolls back to
 * its savepoint and rejects alone; if the commit itself fails, every write in that batch rejects.
 */
export function createGroupCommitter<I, R>(write: (tx: Tx, item: I) => Promise<R>) {
  const queue: Array<Pending<I, R>> = [];
  let running = false;

  async function drain(): Promise<void> {
    running = true;
    try {
      while (queue.length > 0) {
        const batch = queue.splice(0, maxBatch);
        const outcomes: Array<{ ok: true; value: R } | { ok: false; error: unknown }> = [];
        try {
          const db = await getDb();
          await db.transaction(async (tx) => {
            for (const entry of batch) {
              try {
                outcomes.push({ ok: true, value: await tx.transaction((savepoint) => write(savepoint, entry.item)) });
              } catch (error) {
                outcomes.push({ ok: false, error });
              }
            }
          });
        } catch (error) {
          for (const entry of batch) entry.reject(error);
          continue;
        }
        batch.forEach((entry, index) => {
          const outcome = outcomes[index];
          if (outcome?.ok) entry.resolve(outcome.value);
          else entry.reject(outcome ? outcome.error : new Error("write lost from its batch"));
        });
      }
    } finally {
      running = false;
    }
  }

  return (item: I): Promise<R> =>
    new Promise<R>((resolve, reject) => {
      queue.push({ item, resolve, reject });
      if (!running) void drain();
    });
}
