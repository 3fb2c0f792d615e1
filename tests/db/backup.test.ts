import { mkdirSync, readdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { createClient } from "@libsql/client";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { backupDatabase, restoreDatabase } from "@/db/backup";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { feedRequest, samplePayload, setTestEnvironment } from "../feed/support/feed-helpers";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

describe("db:backup and db:restore", () => {
  it("copy a database while posts keep arriving: every candidate answered before the backup began is restored", { timeout: 60_000 }, async () => {
    const ingest = feedIngest;
    const uploads = path.join(testDb.dir, "uploads");
    mkdirSync(path.join(uploads, "ab"), { recursive: true });
    writeFileSync(path.join(uploads, "ab", "abcdef"), "a stored sky map");
    const answered: Array<{ id: string; at: number }> = [];
    let stop = false;
    const burst = (async () => {
      // Several posts in flight at once, as the feed's group commit sees them.
      while (!stop) {
        const results = await Promise.all(
          Array.from({ length: 4 }, async () => {
            const res = await ingest(feedRequest(JSON.stringify(samplePayload({ source: "pipeline-backup" }))));
            return { res, at: Date.now() };
          }),
        );
        for (const { res, at } of results) {
          expect(res.status).toBe(201);
          answered.push({ id: ((await res.json()) as { id: string }).id, at });
        }
      }
    })();
    while (answered.length < 12) await new Promise((r) => setTimeout(r, 20));
    const backupStartedAt = Date.now();
    const before = answered.filter((a) => a.at <= backupStartedAt).map((a) => a.id);
    const result = await backupDatabase(testDb.url, uploads, path.join(testDb.dir, "backups"), new Date(backupStartedAt));
    await new Promise((r) => setTimeout(r, 200)); // the burst goes on after the copy
    stop = true;
    await burst;
    expect(answered.length).toBeGreaterThan(before.length);
    expect(path.basename(result.databaseFile)).toMatch(/^chirpdesk-\d{4}-\d\d-\d\dT\d\d-\d\d-\d\d-\d{3}Z\.db$/);

    const fresh = path.join(testDb.dir, "fresh");
    const url = `file:${path.join(fresh, "data", "restored.db")}`;
    const restored = restoreDatabase(result.databaseFile, url, path.join(fresh, "uploads"));
    expect(restored.uploads).toBe(true);
    expect(readdirSync(path.join(fresh, "uploads", "ab"))).toEqual(["abcdef"]);
    const client = createClient({ url });
    const rows = await client.execute("select id from candidates");
    const ids = new Set(rows.rows.map((r) => String(r.id)));
    for (const id of before) expect(ids.has(id), id).toBe(true);
    const integrity = await client.execute("pragma integrity_check");
    expect(String(integrity.rows[0]?.[0])).toBe("ok");
    client.close();
    expect(() => restoreDatabase(result.databaseFile, url, path.join(fresh, "uploads"))).toThrow(/exists; move it aside/);
  });
});
