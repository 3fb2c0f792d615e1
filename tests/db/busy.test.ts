import Database from "libsql";
import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, onTestFinished } from "vitest";
import { getDb, isDatabaseBusy } from "@/db";
import { busyPauses } from "@/db/busy-retry";
import { openDatabase } from "@/db/client";
import { events } from "@/db/schema";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

/**
 * A busy database file: another connection (standing in for another process) holds the write lock with BEGIN
 * IMMEDIATE while this process writes. Issue 13 item 14.
 */
let testDb: TestDatabase;
let file = "";
beforeAll(async () => {
  testDb = await setupTestDatabase();
  file = testDb.url.slice("file:".length);
});
afterAll(() => testDb.cleanup());

/** Another connection holding the file's write lock until released. */
function holdWriteLock(): { release(): void } {
  const other = new Database(file, { timeout: 0 });
  other.exec("BEGIN IMMEDIATE");
  other.exec("INSERT INTO events (at, kind, data) VALUES (0, 'test.other-process', '{}')");
  return {
    release() {
      if (!other.open) return;
      other.exec("COMMIT");
      other.close();
    },
  };
}

const countKind = async (kind: string) => {
  const db = await getDb();
  const [row] = await db.select({ n: sql<number>`count(*)` }).from(events).where(sql`kind = ${kind}`);
  return Number(row?.n ?? 0);
};

describe("the pauses between attempts", () => {
  it("double from the first, are capped, and add up to the wait exactly", () => {
    expect(busyPauses({ waitMs: 1000, firstPauseMs: 5, maxPauseMs: 200 })).toEqual([5, 10, 20, 40, 80, 160, 200, 200, 200, 85]);
    expect(busyPauses({ waitMs: 3, firstPauseMs: 5 })).toEqual([3]);
  });
});

describe("a write waiting for another process's lock", () => {
  it("leaves the process's reads running, and commits once the lock is released", async () => {
    const db = await getDb();
    const lock = holdWriteLock();
    let writeSettled = false;
    const write = db
      .insert(events)
      .values({ at: new Date(), kind: "test.waiting-write" })
      .finally(() => (writeSettled = true));
    onTestFinished(() => lock.release());
    // A timer turn: the write has made its first attempt. Were the driver's busy timeout the wait, it would have
    // held the event-loop thread until the write failed, and the write would have settled before this timer fired.
    await new Promise((resolve) => setTimeout(resolve, 30));
    const read = await db.select({ n: sql<number>`count(*)` }).from(events);
    expect(read).toHaveLength(1);
    expect(writeSettled).toBe(false);
    lock.release();
    await write;
    expect(await countKind("test.waiting-write")).toBe(1);
  });

  it("then a write transaction opened while the lock is held commits once it is released", async () => {
    const db = await getDb();
    const lock = holdWriteLock();
    onTestFinished(() => lock.release());
    const tx = db.transaction(async (t) => {
      await t.insert(events).values({ at: new Date(), kind: "test.waiting-tx" });
      await t.insert(events).values({ at: new Date(), kind: "test.waiting-tx" });
    });
    await db.select({ n: sql<number>`count(*)` }).from(events);
    lock.release();
    await tx;
    expect(await countKind("test.waiting-tx")).toBe(2);
  });
});

describe("a write locked out past the wait", () => {
  it("fails as busy, writes nothing, and the same client writes normally afterwards", async () => {
    const short = await openDatabase(testDb.url, undefined, { waitMs: 30 });
    try {
      const lock = holdWriteLock();
      onTestFinished(() => lock.release());
      const single = await short.insert(events).values({ at: new Date(), kind: "test.locked-out" }).then(() => null, (e: unknown) => e);
      const inTx = await short
        .transaction(async (t) => {
          await t.insert(events).values({ at: new Date(), kind: "test.locked-out" });
        })
        .then(() => null, (e: unknown) => e);
      lock.release();
      expect(isDatabaseBusy(single), String(single)).toBe(true);
      expect(isDatabaseBusy(inTx), String(inTx)).toBe(true);
      expect(await countKind("test.locked-out")).toBe(0);
      // After a busy answer the driver's connection is unusable until reopened (every write would fail at once).
      await short.insert(events).values({ at: new Date(), kind: "test.after-busy" });
      await short.transaction(async (t) => {
        await t.insert(events).values({ at: new Date(), kind: "test.after-busy" });
      });
      expect(await countKind("test.after-busy")).toBe(2);
    } finally {
      short.$client.close();
    }
  });
});
