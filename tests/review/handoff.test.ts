import { fork, type ChildProcess } from "node:child_process";
import path from "node:path";
import { eq, inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { notifications, shifts } from "@/db/schema";
import { handoffDedupeKey } from "@/lib/review/handoff";
import { queueDueHandoffs, type QueuedHandoffs } from "@/lib/services/queue-handoffs";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { min, writeFixtureLog, type FixtureLog } from "./helpers/fixture-log";

let testDb: TestDatabase;
let log: FixtureLog;

beforeAll(async () => {
  testDb = await setupTestDatabase();
  log = await writeFixtureLog();
});
afterAll(() => testDb.cleanup());

async function handoffRows(shiftIds: string[]) {
  const db = await getDb();
  const rows = await db.select().from(notifications).where(eq(notifications.kind, "handoff"));
  return rows.filter((r) => shiftIds.includes(String((r.payload as { shiftId?: string } | null)?.shiftId)));
}

async function addShifts(endsAtMs: number[], primaryId: string, backupId: string | null = null): Promise<string[]> {
  const db = await getDb();
  const rows = await db
    .insert(shifts)
    .values(endsAtMs.map((end) => ({ startsAt: new Date(end - 3_600_000), endsAt: new Date(end), primaryId, backupId })))
    .returning({ id: shifts.id });
  return rows.map((r) => r.id);
}

describe("queueDueHandoffs", () => {
  it("at a shift's end, queues one e-mail per outgoing shifter and coordinator, and marks the shift", async () => {
    const shift1 = log.shiftIds[0];
    const result = await queueDueHandoffs(new Date(min(151)));
    expect(result).toEqual({ shiftIds: [shift1], rows: 3 });
    const rows = await handoffRows([shift1]);
    expect(rows.map((r) => r.dedupeKey).sort()).toEqual(
      [log.shifter.id, log.shifter2.id, log.coordinator.id].map((u) => handoffDedupeKey(shift1, u)).sort(),
    );
    for (const row of rows) {
      expect(row).toMatchObject({ channel: "email", kind: "handoff", status: "pending" });
      expect(row.url).toMatch(new RegExp(`/review/handoff/${shift1}$`));
      expect(row.body).toContain("Candidates received: 3");
      expect(row.body).toContain("Decisions taken: 2 (1 pursue, 1 dismissed)");
      expect(row.body).toContain("Awaiting a decision: 1");
      expect(row.body).toMatch(/TX-C {2}Paging: 31 min so far \(deadline 1 min\)/);
    }
    const db = await getDb();
    const [marked] = await db.select().from(shifts).where(eq(shifts.id, shift1));
    expect(marked?.handoffQueuedAt?.getTime()).toBe(min(151));
  });

  it("finds nothing the second time", async () => {
    expect(await queueDueHandoffs(new Date(min(152)))).toEqual({ shiftIds: [], rows: 0 });
  });

  it("e-mails whoever is on the shift that covers the end (incoming), once per person", async () => {
    const [outgoing] = await addShifts([min(800)], log.shifter.id);
    const [incoming] = await addShifts([min(860)], log.shifter2.id);
    const result = await queueDueHandoffs(new Date(min(801)));
    expect(result.shiftIds).toContain(outgoing);
    expect(result.shiftIds).not.toContain(incoming);
    const rows = await handoffRows([outgoing as string]);
    const as = Object.fromEntries(rows.map((r) => [r.userId, (r.payload as { recipientAs: string }).recipientAs]));
    expect(as).toEqual({ [log.shifter.id]: "outgoing", [log.shifter2.id]: "incoming", [log.coordinator.id]: "coordinator" });
  });

  it("marks a shift that ended long ago without e-mailing anyone", async () => {
    const [old] = await addShifts([min(805) - 2 * 86_400_000], log.shifter.id);
    const result = await queueDueHandoffs(new Date(min(805)));
    expect(result.shiftIds).toEqual([old]);
    expect(result.rows).toBe(0);
  });

  it("two calls at once in one process queue each shift once", async () => {
    const ids = await addShifts(Array.from({ length: 8 }, (_, k) => min(1000 + k)), log.shifter.id);
    const [a, b] = await Promise.all([queueDueHandoffs(new Date(min(1100))), queueDueHandoffs(new Date(min(1100)))]);
    expectEachOnce(ids, [a, b]);
    const rows = await handoffRows(ids);
    expect(rows).toHaveLength(ids.length * 2); // the shifter (outgoing) and the coordinator, per shift
  });

  it("two processes with their own clients on one file queue each shift once", async () => {
    const ids = await addShifts(Array.from({ length: 8 }, (_, k) => min(2000 + k)), log.shifter.id);
    const worker = path.join(import.meta.dirname, "helpers", "handoff-worker.ts");
    const start = () =>
      new Promise<ChildProcess>((resolve, reject) => {
        const child = fork(worker, [], { execArgv: ["--import", "tsx"], env: { ...process.env, DATABASE_URL: testDb.url }, stdio: "inherit" });
        child.once("message", () => resolve(child));
        child.once("error", reject);
      });
    const [pa, pb] = await Promise.all([start(), start()]);
    const ask = (child: ChildProcess) =>
      new Promise<QueuedHandoffs>((resolve, reject) => {
        child.once("message", (reply: { ok: boolean; result?: QueuedHandoffs; error?: string }) =>
          reply.ok && reply.result ? resolve(reply.result) : reject(new Error(reply.error)),
        );
        child.send({ nowMs: min(2100) });
      });
    try {
      const results = await Promise.all([ask(pa), ask(pb)]);
      expectEachOnce(ids, results);
    } finally {
      pa.send("exit");
      pb.send("exit");
    }
    expect(await handoffRows(ids)).toHaveLength(ids.length * 2);
    const db = await getDb();
    const marked = await db.select().from(shifts).where(inArray(shifts.id, ids));
    expect(marked.every((s) => s.handoffQueuedAt?.getTime() === min(2100))).toBe(true);
  }, 120_000);
});

function expectEachOnce(ids: string[], results: QueuedHandoffs[]) {
  const all = results.flatMap((r) => r.shiftIds);
  expect(new Set(all).size).toBe(all.length);
  for (const id of ids) expect(all).toContain(id);
}
