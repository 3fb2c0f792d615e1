import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

describe("migrations on an empty file", () => {
  it("create every table of the schema", async () => {
    const db = await getDb();
    const rows = await db.$client.execute("SELECT name FROM sqlite_master WHERE type = 'table' ORDER BY name");
    const names = rows.rows.map((r) => String(r.name));
    for (const table of [
      "users", "api_tokens", "candidates", "candidate_revisions", "derived_quantities", "follow_up_tasks", "events",
      "shifts", "sites", "notifications", "escalations", "push_subscriptions", "uploads", "skymaps", "dead_letters", "settings",
    ]) {
      expect(names).toContain(table);
    }
  });

  it("turn on WAL, foreign keys and a short driver busy timeout (longer waits run on timers: tests/db/busy.test.ts)", async () => {
    const db = await getDb();
    expect((await db.$client.execute("PRAGMA journal_mode")).rows[0]?.journal_mode).toBe("wal");
    expect((await db.$client.execute("PRAGMA foreign_keys")).rows[0]?.foreign_keys).toBe(1);
    const timeout = Number((await db.$client.execute("PRAGMA busy_timeout")).rows[0]?.timeout);
    // the driver sits out its busy timeout on the event-loop thread: non-zero, but short enough to stall nothing
    expect(timeout).toBeGreaterThan(0);
    expect(timeout).toBeLessThanOrEqual(50);
  });

  it("refuse a row whose foreign key points nowhere", async () => {
    const db = await getDb();
    await expect(
      db.$client.execute({
        sql: "INSERT INTO api_tokens (id, user_id, label, token_hash, prefix, created_at) VALUES ('t', 'nobody', 'x', 'h', 'p', 0)",
        args: [],
      }),
    ).rejects.toThrow(/FOREIGN KEY/);
  });

  it("are idempotent: applying them again changes nothing", async () => {
    const db = await getDb();
    const before = await db.$client.execute("SELECT count(*) AS n FROM __drizzle_migrations");
    await migrateDatabase(db);
    const after = await db.$client.execute("SELECT count(*) AS n FROM __drizzle_migrations");
    expect(after.rows[0]?.n).toBe(before.rows[0]?.n);
  });
});
