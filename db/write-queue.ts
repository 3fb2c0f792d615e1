import type { Client, InStatement, Transaction, TransactionMode } from "@libsql/client";

/** How long a write waits for this process's earlier writes before failing loudly instead of hanging. */
const WAIT_LIMIT_MS = 30_000;

/**
 * Serialises this process's writes to an embedded database file.
 *
 * The embedded driver runs each statement synchronously and sits out a locked file (busy timeout) on the event-loop
 * thread. If a second write starts while this process's own write transaction is between two awaited statements,
 * it blocks the very loop the transaction needs to finish: both stall until the timeout and one fails with
 * SQLITE_BUSY. Queuing writes in the process prevents that; between processes SQLite's own lock still serialises.
 * Reads never wait (WAL lets them run beside a writer).
 */
export function serialiseWrites(client: Client): Client {
  let tail: Promise<void> = Promise.resolve();

  function acquire(): Promise<() => void> {
    let release!: () => void;
    const held = new Promise<void>((resolve) => (release = resolve));
    const previous = tail;
    tail = previous.then(() => held);
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        reject(new Error(`database is busy: a write waited over ${WAIT_LIMIT_MS} ms for this process's earlier writes`));
        // Our turn may still come; pass it straight on.
        void previous.then(release);
      }, WAIT_LIMIT_MS);
      void previous.then(() => {
        clearTimeout(timer);
        resolve(once(release));
      });
    });
  }

  async function locked<T>(fn: () => Promise<T>): Promise<T> {
    const release = await acquire();
    try {
      return await fn();
    } finally {
      release();
    }
  }

  async function transaction(mode: TransactionMode = "write"): Promise<Transaction> {
    if (mode === "read") return client.transaction(mode);
    const release = await acquire();
    let tx: Transaction;
    try {
      tx = await client.transaction(mode);
    } catch (error) {
      release();
      throw error;
    }
    return wrapTransaction(tx, release);
  }

  return new Proxy(client, {
    get(target, prop, receiver) {
      switch (prop) {
        case "execute":
          return (stmt: InStatement, args?: unknown) =>
            isRead(stmt)
              ? (target.execute as (s: InStatement, a?: unknown) => ReturnType<Client["execute"]>)(stmt, args)
              : locked(() => (target.execute as (s: InStatement, a?: unknown) => ReturnType<Client["execute"]>)(stmt, args));
        case "batch":
          return (stmts: InStatement[], mode?: TransactionMode) =>
            mode === "read" ? target.batch(stmts, mode) : locked(() => target.batch(stmts, mode));
        case "migrate":
          return (stmts: InStatement[]) => locked(() => target.migrate(stmts));
        case "executeMultiple":
          return (sql: string) => locked(() => target.executeMultiple(sql));
        case "transaction":
          return transaction;
        default: {
          const value: unknown = Reflect.get(target, prop, receiver);
          return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
        }
      }
    },
  });
}

function isRead(stmt: InStatement): boolean {
  const sql = typeof stmt === "string" ? stmt : stmt.sql;
  return /^\s*(select|explain|pragma\s+\w+\s*$)/i.test(sql);
}

function once(fn: () => void): () => void {
  let done = false;
  return () => {
    if (!done) {
      done = true;
      fn();
    }
  };
}

/** Releases the queue when the transaction ends, however it ends. */
function wrapTransaction(tx: Transaction, release: () => void): Transaction {
  return new Proxy(tx, {
    get(target, prop, receiver) {
      if (prop === "commit" || prop === "rollback") {
        return async () => {
          try {
            await (prop === "commit" ? target.commit() : target.rollback());
          } finally {
            release();
          }
        };
      }
      if (prop === "close") {
        return () => {
          try {
            target.close();
          } finally {
            release();
          }
        };
      }
      const value: unknown = Reflect.get(target, prop, receiver);
      return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
}
