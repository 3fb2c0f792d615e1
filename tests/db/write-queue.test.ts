import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events } from "@/db/schema";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

const pause = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe("writes within one process", () => {
  it("interleaved write transactions and lone writes all commit (none stalls on the file lock)", async () => {
    const db = await getDb();
    const tx = (label: string) =>
      db.transaction(async (t) => {
        await t.insert(events).values({ at: new Date(), kind: "test.queue", data: { label, step: 1 } });
        await pause(20); // yields to the event loop mid-transaction, as real handlers do
        await t.insert(events).values({ at: new Date(), kind: "test.queue", data: { label, step: 2 } });
      });
    const lone = (label: string) => db.insert(events).values({ at: new Date(), kind: "test.queue", data: { label, step: 0 } });
    await Promise.all([tx("a"), lone("x"), tx("b"), lone("y"), tx("c")]);
    const [row] = await db.select({ n: sql<number>`count(*)` }).from(events).where(sql`kind = 'test.queue'`);
    expect(row?.n).toBe(8);
  });

  it("a failed transaction releases the queue for the next writer", async () => {
    const db = await getDb();
    await expect(
      db.transaction(async (t) => {
        await t.insert(events).values({ at: new Date(), kind: "test.rollback" });
        throw new Error("changed my mind");
      }),
    ).rejects.toThrow("changed my mind");
    await db.insert(events).values({ at: new Date(), kind: "test.after-rollback" });
    const rows = await db.select({ kind: events.kind }).from(events).where(sql`kind LIKE 'test.%rollback'`);
    expect(rows.map((r) => r.kind)).toEqual(["test.after-rollback"]);
  });
});
