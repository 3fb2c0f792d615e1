import { execFile } from "node:child_process";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { candidates } from "@/db/schema";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { rowCounts, samplePayload, setTestEnvironment } from "./support/feed-helpers";

const run = promisify(execFile);
let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

describe("two processes posting the same new candidates at once", () => {
  it("create each candidate once and answer the loser 200, never a 5xx", { timeout: 90_000 }, async () => {
    const bodies = Array.from({ length: 12 }, () => JSON.stringify(samplePayload({ source: "pipeline-twin" })));
    const file = path.join(testDb.dir, "bodies.json");
    writeFileSync(file, JSON.stringify(bodies));
    const tsx = path.resolve("node_modules/.bin/tsx");
    const script = path.resolve("tests/feed/support/ingest-process.ts");
    // Both start at the same instant, after their (slow) module loading is done.
    const startAt = String(Date.now() + 6_000);
    const env = { ...process.env, DATABASE_URL: testDb.url };
    const [a, b] = await Promise.all([
      run(tsx, [script, file, startAt], { env, timeout: 80_000 }),
      run(tsx, [script, file, startAt], { env, timeout: 80_000 }),
    ]);
    const statusesA = JSON.parse(a.stdout.trim().split("\n").pop() ?? "[]") as number[];
    const statusesB = JSON.parse(b.stdout.trim().split("\n").pop() ?? "[]") as number[];
    expect(statusesA).toHaveLength(12);
    expect(statusesB).toHaveLength(12);
    for (let i = 0; i < 12; i++) {
      expect([statusesA[i], statusesB[i]].sort()).toEqual([200, 201]);
    }
    const db = await getDb();
    const rows = await db.select({ id: candidates.id }).from(candidates).where(eq(candidates.source, "pipeline-twin"));
    expect(rows).toHaveLength(12);
    const counts = await rowCounts();
    expect(counts.revisions).toBe(12);
    expect(counts.derived).toBe(12);
  });
});
