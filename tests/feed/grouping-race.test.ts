import { execFile } from "node:child_process";
import { writeFileSync } from "node:fs";
import path from "node:path";
import { promisify } from "node:util";
import { inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { candidates, triggers } from "@/db/schema";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { samplePayload, setTestEnvironment } from "./support/feed-helpers";

const run = promisify(execFile);
const rounds = 100;
let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

interface Answer {
  status: number;
  id?: string;
  outcome?: string;
}

describe("two pipelines posting the same signal at the same instant through two app processes", () => {
  it(`end up in one candidate, ${rounds} rounds out of ${rounds}`, { timeout: 180_000 }, async () => {
    // Signal i: pipe-race-a at t_i, pipe-race-b 0.25 s later (inside ±1 s); signals 20 s apart.
    const base = Date.UTC(2026, 11, 2, 1, 0, 0);
    const bodiesFor = (source: string, offsetMs: number) =>
      Array.from({ length: rounds }, (_, i) =>
        JSON.stringify(samplePayload({ source, externalId: `R${i}`, eventTime: new Date(base + i * 20_000 + offsetMs).toISOString() })),
      );
    const fileA = path.join(testDb.dir, "race-a.json");
    const fileB = path.join(testDb.dir, "race-b.json");
    writeFileSync(fileA, JSON.stringify(bodiesFor("pipe-race-a", 0)));
    writeFileSync(fileB, JSON.stringify(bodiesFor("pipe-race-b", 250)));
    const tsx = path.resolve("node_modules/.bin/tsx");
    const script = path.resolve("tests/feed/support/race-process.ts");
    // Both start after their (slow) module loading, then post round i at the same instant.
    const startAt = String(Date.now() + 8_000);
    const roundMs = "120";
    const env = { ...process.env, DATABASE_URL: testDb.url };
    const [a, b] = await Promise.all([
      run(tsx, [script, fileA, startAt, roundMs], { env, timeout: 170_000 }),
      run(tsx, [script, fileB, startAt, roundMs], { env, timeout: 170_000 }),
    ]);
    const answersA = JSON.parse(a.stdout.trim().split("\n").pop() ?? "[]") as Answer[];
    const answersB = JSON.parse(b.stdout.trim().split("\n").pop() ?? "[]") as Answer[];
    expect(answersA).toHaveLength(rounds);
    expect(answersB).toHaveLength(rounds);
    let split = 0;
    for (let i = 0; i < rounds; i++) {
      const [x, y] = [answersA[i], answersB[i]];
      expect([x?.status, y?.status]).toEqual([201, 201]);
      expect([x?.outcome, y?.outcome].sort()).toEqual(["created", "joined"]);
      if (x?.id !== y?.id) split += 1;
    }
    expect(split).toBe(0);
    const db = await getDb();
    const rows = await db.select({ candidateId: triggers.candidateId }).from(triggers).where(inArray(triggers.source, ["pipe-race-a", "pipe-race-b"]));
    expect(rows).toHaveLength(2 * rounds);
    const ids = [...new Set(rows.map((r) => r.candidateId))];
    expect(ids).toHaveLength(rounds);
    const stored = await db.select({ n: candidates.triggerCount }).from(candidates).where(inArray(candidates.id, ids));
    expect(stored.every((c) => c.n === 2)).toBe(true);
  });
});
