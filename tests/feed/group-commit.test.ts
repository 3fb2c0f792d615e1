import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { createGroupCommitter, type GroupWrite } from "@/db/group-commit";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
  const db = await getDb();
  await db.$client.execute("create table scratch (id integer primary key, label text not null unique)");
});
afterAll(() => testDb.cleanup());

async function labels(): Promise<string[]> {
  const db = await getDb();
  const { rows } = await db.$client.execute("select label from scratch order by id");
  return rows.map((row) => String(row.label));
}

/** Inserts a label and reports which transaction it ran in (the GroupWrite's statement handle). */
function insertLabel(seen: Array<GroupWrite["sql"]>) {
  return async (tx: GroupWrite, label: string) => {
    seen.push(tx.sql);
    await tx.sql.execute({ sql: "insert into scratch (label) values (?)", args: [label] });
    return label;
  };
}

describe("group commit", () => {
  it("keeps a failing write out and its neighbours in, each in its own savepoint", async () => {
    const seen: Array<GroupWrite["sql"]> = [];
    const commit = createGroupCommitter(insertLabel(seen));
    const outcomes = await Promise.allSettled(["a1", "a2", "a1", "a3"].map((label) => commit(label)));
    expect(outcomes.map((o) => o.status)).toEqual(["fulfilled", "fulfilled", "rejected", "fulfilled"]);
    expect(await labels()).toEqual(["a1", "a2", "a3"]);
  });

  it("waits up to gatherMs for writes that are on their way, and shares one commit with them", async () => {
    const seen: Array<GroupWrite["sql"]> = [];
    let onTheirWay = 2;
    const commit = createGroupCommitter(insertLabel(seen), { expected: () => onTheirWay, gatherMs: 2_000 });
    const started = Date.now();
    const first = commit("b1");
    await new Promise((resolve) => setTimeout(resolve, 20));
    onTheirWay = 1;
    const second = commit("b2");
    await new Promise((resolve) => setTimeout(resolve, 20));
    onTheirWay = 0;
    const third = commit("b3");
    await Promise.all([first, second, third]);
    expect(new Set(seen).size).toBe(1);
    // The last arrival ends the wait at once; the 2 s bound was never reached.
    expect(Date.now() - started).toBeLessThan(1_500);
    expect(await labels()).toEqual(["a1", "a2", "a3", "b1", "b2", "b3"]);
  });

  it("commits at once when nothing is on its way, and gives up waiting after gatherMs", async () => {
    const seen: Array<GroupWrite["sql"]> = [];
    const commit = createGroupCommitter(insertLabel(seen), { expected: () => 0, gatherMs: 60_000 });
    await commit("c1");
    const waiting: Array<GroupWrite["sql"]> = [];
    const stuck = createGroupCommitter(insertLabel(waiting), { expected: () => 5, gatherMs: 30 });
    await stuck("c2");
    await stuck("c3");
    expect(new Set(waiting).size).toBe(2);
    expect(await labels()).toEqual(["a1", "a2", "a3", "b1", "b2", "b3", "c1", "c2", "c3"]);
  });
});
