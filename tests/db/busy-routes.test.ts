import Database from "libsql";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getBoard } from "@/app/api/v1/board/route";
import { POST as moveCard } from "@/app/api/v1/candidates/[id]/triage/route";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { PATCH as patchMe } from "@/app/api/v1/me/route";
import { getDb } from "@/db";
import { candidates, users } from "@/db/schema";
import { callRoute, createCaller, insertCandidate, rawCall, type Caller } from "../boards/helpers/api";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment } from "../feed/support/feed-helpers";

/**
 * Every route answers a busy database with 503 and Retry-After, writes nothing, and a bearer read still answers:
 * another connection (standing in for another process) holds the file's write lock past the wait. Issue 13 item 14.
 */
let testDb: TestDatabase;
let shifter: Caller;
const clockMs = Date.UTC(2026, 11, 1, 4, 13, 0);

beforeAll(async () => {
  setTestEnvironment();
  process.env.DATABASE_BUSY_WAIT_MS = "40";
  testDb = await setupTestDatabase();
  shifter = await createCaller("shifter");
});
afterAll(async () => {
  delete process.env.DATABASE_BUSY_WAIT_MS;
  await testDb.cleanup();
});

async function whileLocked<T>(fn: () => Promise<T>): Promise<T> {
  const other = new Database(testDb.url.slice("file:".length), { timeout: 0 });
  other.exec("BEGIN IMMEDIATE");
  try {
    return await fn();
  } finally {
    other.exec("ROLLBACK");
    other.close();
  }
}

function expectBusy(res: Response, json: Record<string, unknown>) {
  expect(res.status).toBe(503);
  expect(res.headers.get("retry-after")).toBe("1");
  expect(json).toMatchObject({ error: expect.stringMatching(/busy/), retryAfterSeconds: 1 });
  expect(json.requestId).toMatch(/^[0-9a-f-]{36}$/);
}

describe("a busy database", () => {
  it("a card move answers 503 with Retry-After and changes nothing; the same move succeeds after", async () => {
    const id = await insertCandidate();
    const before = await rowCounts();
    const res = await whileLocked(() => rawCall(moveCard, { caller: shifter, body: { to: "acknowledged" }, params: { id } }));
    expectBusy(res, (await res.json()) as Record<string, unknown>);
    expect(await rowCounts()).toEqual(before);
    const db = await getDb();
    const [row] = await db.select({ state: candidates.triageState }).from(candidates).where(eq(candidates.id, id));
    expect(row?.state).toBe("new");
    const again = await callRoute(moveCard, { caller: shifter, body: { to: "acknowledged" }, params: { id } });
    expect(again.status).toBe(200);
  });

  it("a feed post answers 503 with Retry-After and stores nothing; the same post is stored after", async () => {
    const body = JSON.stringify(samplePayload());
    const route = feedIngest.with({ now: () => clockMs });
    const before = await rowCounts();
    const res = await whileLocked(() => route(feedRequest(body, { nowMs: clockMs })));
    expectBusy(res, (await res.json()) as Record<string, unknown>);
    expect(await rowCounts()).toEqual(before);
    const again = await route(feedRequest(body, { nowMs: clockMs }));
    expect(again.status).toBe(201);
  });

  it("a profile change answers 503 and keeps the old name", async () => {
    const res = await whileLocked(() => rawCall(patchMe, { caller: shifter, method: "PATCH", body: { name: "Renamed While Busy" } }));
    expectBusy(res, (await res.json()) as Record<string, unknown>);
    const db = await getDb();
    const [row] = await db.select({ name: users.name }).from(users).where(eq(users.id, shifter.user.id));
    expect(row?.name).toBe(shifter.user.name);
  });

  it("a bearer read still answers 200 (recording the token's use is not in the request's path)", async () => {
    const reader = await createCaller("observer");
    const res = await whileLocked(() => rawCall(getBoard, { caller: reader }));
    expect(res.status).toBe(200);
  });
});
