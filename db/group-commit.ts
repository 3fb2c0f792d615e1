import type { Client, InStatement, Transaction } from "@libsql/client";
import { drizzle } from "drizzle-orm/libsql";
import { getDb, type Database } from "./index";
import * as schema from "./schema";

interface Pending<I, R> {
  item: I;
  resolve: (result: R) => void;
  reject: (error: unknown) => void;
}

/** One write inside a group: the libSQL transaction for hand-written statements, and Drizzle over the same one. */
export interface GroupWrite {
  sql: Pick<Transaction, "execute">;
  orm: Database;
}

/** Most writes folded into one transaction; bounds how long one commit holds the write lock. */
const maxBatch = 32;

export interface GroupCommitOptions {
  /**
   * How many writes are on their way (e.g. posts whose physics is still running). While any are, a batch waits up
   * to `gatherMs` for them before committing: the commit delay of PostgreSQL's `commit_delay`/`commit_siblings`
   * and MySQL's `binlog_group_commit_sync_delay`. Each commit is an fsync that blocks the event loop, so fewer,
   * fuller commits leave the loop more time for requests.
   */
  expected?: () => number;
  gatherMs?: number;
}

/**
 * A Drizzle database whose statements all run on whichever libSQL transaction the committer currently holds.
 * Built once per committer: constructing Drizzle per batch would cost more than the statements it saves.
 */
function ormOver(current: () => Transaction): Database {
  const forwarding = {
    execute: (stmt: InStatement) => current().execute(stmt),
    batch: (stmts: InStatement[]) => current().batch(stmts),
    transaction: () => Promise.reject(new Error("a group-commit write cannot open its own transaction; it already runs in one")),
  } as unknown as Client;
  return drizzle(forwarding, { schema }) as Database;
}

/**
 * Group commit: writes that arrive while a transaction is being written share the next one, each inside its own
 * savepoint, so a burst costs one commit (one fsync) instead of one per write. A write that fails rolls back to
 * its savepoint and rejects alone; if the commit itself fails, every write in that batch rejects.
 */
export function createGroupCommitter<I, R>(write: (tx: GroupWrite, item: I) => Promise<R>, options: GroupCommitOptions = {}) {
  const queue: Array<Pending<I, R>> = [];
  let running = false;
  const expected = options.expected ?? (() => 0);
  const gatherMs = options.gatherMs ?? 0;
  let wake: (() => void) | null = null;

  /** Waits up to gatherMs while writes are on their way and the batch is not full. */
  async function gather(): Promise<void> {
    if (gatherMs <= 0 || queue.length >= maxBatch || expected() === 0) return;
    await new Promise<void>((resolve) => {
      const timer = setTimeout(done, gatherMs);
      function done() {
        clearTimeout(timer);
        wake = null;
        resolve();
      }
      wake = done;
    });
  }
  let active: Transaction | null = null;
  const orm = ormOver(() => {
    if (!active) throw new Error("no group-commit transaction is open");
    return active;
  });

  async function writeBatch(batch: Array<Pending<I, R>>) {
    const outcomes: Array<{ ok: true; value: R } | { ok: false; error: unknown }> = [];
    const db = await getDb();
    const tx = await db.$client.transaction("write");
    active = tx;
    try {
      for (const entry of batch) {
        await tx.execute("savepoint group_write");
        try {
          const value = await write({ sql: tx, orm }, entry.item);
          await tx.execute("release savepoint group_write");
          outcomes.push({ ok: true, value });
        } catch (error) {
          await tx.execute("rollback to savepoint group_write");
          await tx.execute("release savepoint group_write");
          outcomes.push({ ok: false, error });
        }
      }
      await tx.commit();
    } finally {
      active = null;
      tx.close();
    }
    return outcomes;
  }

  async function drain(): Promise<void> {
    running = true;
    try {
      while (queue.length > 0) {
        await gather();
        const batch = queue.splice(0, maxBatch);
        let outcomes: Awaited<ReturnType<typeof writeBatch>>;
        try {
          outcomes = await writeBatch(batch);
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
      if (wake && (queue.length >= maxBatch || expected() === 0)) wake();
      if (!running) void drain();
    });
}
