import type { Client, InStatement, Transaction, TransactionMode } from "@libsql/client";
import { isDatabaseBusy } from "./errors";

/**
 * How a file database waits for another process's write lock. The embedded driver's own busy timeout sleeps on the
 * event-loop thread, so a long one stalls every request of the process (reads and static files too) while one write
 * waits. The driver's timeout is kept short and the waiting happens here, between attempts, on timers.
 */
export interface BusyWait {
  /** total pause between attempts before a write gives up with the busy error (the driver's timeouts add to it) */
  waitMs: number;
  /** the first pause; each next one doubles, up to maxPauseMs */
  firstPauseMs?: number;
  maxPauseMs?: number;
}

/** The pauses between attempts: doubling from the first, capped, until they add up to waitMs. No clock is read. */
export function busyPauses({ waitMs, firstPauseMs = 5, maxPauseMs = 200 }: BusyWait): number[] {
  const pauses: number[] = [];
  let total = 0;
  for (let pause = firstPauseMs; total < waitMs; pause = Math.min(pause * 2, maxPauseMs)) {
    const next = Math.min(pause, waitMs - total);
    pauses.push(next);
    total += next;
  }
  return pauses;
}

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * A client that retries a whole operation when the file is locked, and reopens its connections after every busy
 * answer. Only operations that are atomic on their own are retried: one statement, a batch, a migration, and the
 * BEGIN IMMEDIATE that opens a write transaction (once begun, a WAL writer holds the lock, so its statements do not
 * meet a busy file). After SQLITE_BUSY the embedded driver leaves the failed statement active on its pooled
 * connection, and every later write there fails at once (busy snapshot, or "SQL statements in progress" at COMMIT),
 * so the pool is reopened as soon as no transaction holds one of its connections.
 */
export function retryWhenBusy(client: Client, wait: BusyWait): Client {
  const pauses = busyPauses(wait);
  let openTransactions = 0;
  let stale = false;

  async function refresh(): Promise<void> {
    if (!stale || openTransactions > 0) return;
    stale = false;
    await client.reconnect();
  }

  async function attempt<T>(run: () => Promise<T>, retry: boolean): Promise<T> {
    for (let i = 0; ; i++) {
      try {
        return await run();
      } catch (error) {
        if (!isDatabaseBusy(error)) throw error;
        stale = true;
        await refresh();
        const pause = pauses[i];
        if (!retry || pause === undefined) throw error;
        await sleep(pause);
      }
    }
  }

  function track(tx: Transaction): Transaction {
    openTransactions += 1;
    let settled = false;
    const settle = () => {
      if (settled) return;
      settled = true;
      openTransactions -= 1;
      void refresh();
    };
    const noteBusy = (error: unknown) => {
      if (isDatabaseBusy(error)) stale = true;
      throw error;
    };
    return new Proxy(tx, {
      get(target, prop, receiver) {
        if (prop === "commit" || prop === "rollback") {
          return () => (prop === "commit" ? target.commit() : target.rollback()).catch(noteBusy).finally(settle);
        }
        if (prop === "close") {
          return () => {
            try {
              target.close();
            } finally {
              settle();
            }
          };
        }
        if (prop === "execute" || prop === "batch" || prop === "executeMultiple") {
          const fn = Reflect.get(target, prop, receiver) as (...a: unknown[]) => Promise<unknown>;
          return (...args: unknown[]) => fn.apply(target, args).catch(noteBusy);
        }
        const value: unknown = Reflect.get(target, prop, receiver);
        return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
      },
    });
  }

  return new Proxy(client, {
    get(target, prop, receiver) {
      switch (prop) {
        case "execute":
          return (stmt: InStatement, args?: unknown) =>
            attempt(() => (target.execute as (s: InStatement, a?: unknown) => ReturnType<Client["execute"]>)(stmt, args), true);
        case "batch":
          return (stmts: InStatement[], mode?: TransactionMode) => attempt(() => target.batch(stmts, mode), true);
        case "migrate":
          return (stmts: InStatement[]) => attempt(() => target.migrate(stmts), true);
        case "executeMultiple":
          // not atomic: a busy answer may come after some statements ran, so it is not retried
          return (sql: string) => attempt(() => target.executeMultiple(sql), false);
        case "transaction":
          return async (mode?: TransactionMode) => track(await attempt(() => target.transaction(mode), true));
        default: {
          const value: unknown = Reflect.get(target, prop, receiver);
          return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
        }
      }
    },
  });
}
