import { fork, type ChildProcess } from "node:child_process";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, followUpTasks } from "@/db/schema";
import { POST as claimRoute } from "@/app/api/v1/tasks/[id]/claim/route";
import { createTasks } from "@/lib/services/create-tasks";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, insertCandidate, type Caller } from "./helpers/api";

const RACES = 100;
let testDb: TestDatabase;
let planner: Caller;
let observerA: Caller;
let observerB: Caller;

beforeAll(async () => {
  testDb = await setupTestDatabase();
  planner = await createCaller("shifter");
  observerA = await createCaller("observer", "Observer Alpha");
  observerB = await createCaller("observer", "Observer Beta");
});
afterAll(() => testDb.cleanup());

async function makeOpenTasks(n: number): Promise<string[]> {
  const candidateId = await insertCandidate({ triageState: "pursue" });
  const tasks = await createTasks(planner.user, candidateId, Array.from({ length: n }, () => ({ kind: "wide-field-tiling" as const, siteId: null, windowStart: null, windowEnd: null, priority: 2, notes: "" })));
  return tasks.map((t) => t.id);
}

async function expectOneClaimEach(taskIds: string[]) {
  const db = await getDb();
  for (const id of taskIds) {
    const [task] = await db.select().from(followUpTasks).where(eq(followUpTasks.id, id));
    expect(task?.state).toBe("claimed");
    const claimEvents = await db.select().from(events).where(eq(events.taskId, id));
    expect(claimEvents.filter((e) => e.toState === "claimed")).toHaveLength(1);
  }
}

describe("two observers claim the same task at once", () => {
  it(`through the route handlers, ${RACES} races: exactly one winner each, the loser sees who`, async () => {
    const taskIds = await makeOpenTasks(RACES);
    for (const id of taskIds) {
      const [a, b] = await Promise.all([
        callRoute(claimRoute, { caller: observerA, params: { id }, method: "POST" }),
        callRoute(claimRoute, { caller: observerB, params: { id }, method: "POST" }),
      ]);
      expect([a.status, b.status].sort()).toEqual([200, 409]);
      const winner = a.status === 200 ? observerA : observerB;
      const loser = a.status === 200 ? b : a;
      expect(loser.json.claimedBy).toEqual({ id: winner.user.id, name: winner.user.name });
      expect(loser.json.error).toContain(winner.user.name);
    }
    await expectOneClaimEach(taskIds);
  });

  it(`from two processes with separate libSQL clients on one file, ${RACES} races: exactly one winner each`, async () => {
    const taskIds = await makeOpenTasks(RACES);
    const worker = path.join(import.meta.dirname, "helpers", "claim-worker.ts");
    const start = () =>
      new Promise<ChildProcess>((resolve, reject) => {
        const child = fork(worker, [], { execArgv: ["--import", "tsx"], env: { ...process.env, DATABASE_URL: testDb.url }, stdio: "inherit" });
        child.once("message", () => resolve(child));
        child.once("error", reject);
      });
    const [pa, pb] = await Promise.all([start(), start()]);
    if (!pa || !pb) throw new Error("workers did not start");
    const ask = (child: ChildProcess, taskId: string, caller: Caller) =>
      new Promise<{ status: number; claimedById?: string; details?: { claimedBy?: { id: string } } }>((resolve) => {
        const onMessage = (reply: { taskId: string; status: number }) => {
          if (reply.taskId !== taskId) return;
          child.off("message", onMessage);
          resolve(reply);
        };
        child.on("message", onMessage);
        child.send({ taskId, user: caller.user });
      });
    try {
      for (const id of taskIds) {
        const [a, b] = await Promise.all([ask(pa, id, observerA), ask(pb, id, observerB)]);
        expect([a.status, b.status].sort()).toEqual([200, 409]);
        const winnerId = a.status === 200 ? observerA.user.id : observerB.user.id;
        const loser = a.status === 200 ? b : a;
        expect(loser.details?.claimedBy?.id).toBe(winnerId);
      }
    } finally {
      pa.send("exit");
      pb.send("exit");
    }
    await expectOneClaimEach(taskIds);
  }, 120_000);
});
