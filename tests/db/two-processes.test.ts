import { spawn } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

/** A separate Node process that appends events in write transactions, as a second app or worker would. */
function writer(url: string, label: string, count: number): Promise<number> {
  const script = `
    import { createClient } from "@libsql/client";
    const c = createClient({ url: ${JSON.stringify(url)}, timeout: 10000 });
    for (let i = 0; i < ${count}; i++) {
      const tx = await c.transaction("write");
      const last = await tx.execute("SELECT coalesce(max(id), 0) AS m FROM events");
      await tx.execute({ sql: "INSERT INTO events (at, kind, data) VALUES (?, 'test.write', ?)", args: [Date.now(), JSON.stringify({ by: ${JSON.stringify(label)}, sawMax: Number(last.rows[0].m) })] });
      await tx.commit();
    }
    c.close();
  `;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--input-type=module", "-e", script], { stdio: ["ignore", "inherit", "inherit"] });
    child.on("error", reject);
    child.on("exit", (code) => resolve(code ?? -1));
  });
}

describe("two processes on one database file", () => {
  it("both complete every write transaction, none lost and none failing on a lock", async () => {
    const codes = await Promise.all([writer(testDb.url, "a", 150), writer(testDb.url, "b", 150)]);
    expect(codes).toEqual([0, 0]);
    const db = await getDb();
    const rows = await db.$client.execute("SELECT count(*) AS n, count(DISTINCT id) AS d FROM events WHERE kind = 'test.write'");
    expect(Number(rows.rows[0]?.n)).toBe(300);
    expect(Number(rows.rows[0]?.d)).toBe(300);
  });
});
