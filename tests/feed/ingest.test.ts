import { NextRequest } from "next/server";
import { and, asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { GET as getCandidate } from "@/app/api/v1/candidates/[id]/route";
import { getDb } from "@/db";
import { candidateRevisions, candidates, derivedQuantities, events, followUpTasks } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { toPhysicsInput } from "@/lib/feed/physics-input";
import { onCandidateIngested, onTasksCancelled } from "@/lib/notify/hooks";
import type * as Hooks from "@/lib/notify/hooks";
import { computeDerived, defaultPhysicsSettings } from "@/lib/physics";
import type { FeedCandidate } from "@/lib/validations/feed";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment } from "./support/feed-helpers";

// Keep the paging hooks' real bodies but record the calls.
vi.mock("@/lib/notify/hooks", async (importOriginal) => {
  const real = await importOriginal<typeof Hooks>();
  return { ...real, onCandidateIngested: vi.fn(real.onCandidateIngested), onTasksCancelled: vi.fn(real.onTasksCancelled) };
});

let testDb: TestDatabase;
let clockMs = Date.UTC(2026, 11, 1, 4, 13, 0);
const route = feedIngest.with({ now: () => clockMs });
let observerToken = "";
let observerId = "";

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  const observer = await createTestUser("observer");
  observerId = observer.id;
  observerToken = (await createApiToken(observer.id, "test")).token;
});
afterAll(() => testDb.cleanup());
beforeEach(() => {
  vi.mocked(onCandidateIngested).mockClear();
  vi.mocked(onTasksCancelled).mockClear();
});

async function post(payload: FeedCandidate) {
  const res = await route(feedRequest(JSON.stringify(payload), { nowMs: clockMs }));
  return { status: res.status, body: await res.json() };
}

async function readCandidate(id: string, token = observerToken) {
  const req = new NextRequest(`http://localhost/api/v1/candidates/${id}`, { headers: { authorization: `Bearer ${token}` } });
  const res = await getCandidate(req, { params: Promise.resolve({ id }) });
  return { status: res.status, body: await res.json() };
}

describe("ingesting a new candidate", () => {
  it("answers 201 with { id, revision, derived } and stores candidate, revision, derived row and a created event", async () => {
    const payload = samplePayload();
    const { status, body } = await post(payload);
    expect(status).toBe(201);
    expect(body).toMatchObject({ id: expect.any(String), revision: 1, outcome: "created" });
    const db = await getDb();
    const [candidate] = await db.select().from(candidates).where(eq(candidates.id, body.id));
    expect(candidate).toMatchObject({ triageState: "new", stage: "first-look", currentRevision: 1, networkSnr: 12.5 });
    expect(candidate?.receivedAt.getTime()).toBe(clockMs);
    const [revision] = await db.select().from(candidateRevisions).where(eq(candidateRevisions.candidateId, body.id));
    const [derivedRow] = await db.select().from(derivedQuantities).where(eq(derivedQuantities.revisionId, revision?.id ?? ""));
    expect(derivedRow?.derived).toEqual(body.derived);
    expect(derivedRow?.chirpMassDetectorFrame).toBe(body.derived.chirpMass.detectorFrame.value);
    expect(candidate?.chirpMassDetectorFrame).toBe(body.derived.chirpMass.detectorFrame.value);
    const created = await db.select().from(events).where(eq(events.candidateId, body.id));
    expect(created.map((e) => e.kind)).toEqual(["candidate.created"]);
    expect(created[0]?.data).toMatchObject({ externalId: payload.externalId, stage: "first-look", triageState: "new" });
    expect(onCandidateIngested).toHaveBeenCalledTimes(1);
    expect(vi.mocked(onCandidateIngested).mock.calls[0]?.[1]).toMatchObject({ isNewCandidate: true, revision: 1, eventId: created[0]?.id });
  });

  it("answers derived equal to computeDerived on the same input (settings, seed source/externalId/revision, receipt time)", async () => {
    const payload = samplePayload({ spins: { chi1: 0.1, chi2: -0.05 }, eventTime: "2026-12-01T04:12:00.250Z" });
    const { body } = await post(payload);
    const receivedAt = new Date(clockMs);
    const seed = `${payload.source}/${payload.externalId}/${payload.revision}`;
    const expected = computeDerived(toPhysicsInput(payload, receivedAt), defaultPhysicsSettings, seed);
    // JSON round trip: the route answers JSON.
    expect(body.derived).toEqual(JSON.parse(JSON.stringify(expected)));
    // seconds since eventTime at receipt: 04:13:00.000 − 04:12:00.250 = 59.75 s
    expect(toPhysicsInput(payload, receivedAt).secondsSinceEventTimeAtReceipt).toBeCloseTo(59.75, 9);
  });
});

describe("the stored payload", () => {
  async function storedPayload(candidateId: string) {
    const db = await getDb();
    const [revision] = await db.select().from(candidateRevisions).where(eq(candidateRevisions.candidateId, candidateId));
    return revision?.payload;
  }

  it("is the body as posted (here pretty-printed) when validation changed nothing", async () => {
    const payload = samplePayload();
    const res = await route(feedRequest(JSON.stringify(payload, null, 2), { nowMs: clockMs }));
    expect(res.status).toBe(201);
    expect(await storedPayload((await res.json()).id)).toEqual(payload);
  });

  it("is the validated payload when validation trimmed a name", async () => {
    const payload = samplePayload();
    const padded = { ...payload, source: `  ${payload.source} `, externalId: ` ${payload.externalId}` };
    const res = await route(feedRequest(JSON.stringify(padded), { nowMs: clockMs }));
    expect(res.status).toBe(201);
    const stored = await storedPayload((await res.json()).id);
    expect(stored).toEqual(payload);
  });
});

describe("all or nothing", () => {
  it("rolls the whole revision back when a step inside the transaction fails", async () => {
    vi.mocked(onCandidateIngested).mockRejectedValueOnce(new Error("paging outbox unavailable"));
    const before = await rowCounts();
    const payload = samplePayload();
    const failed = await post(payload);
    expect(failed.status).toBe(500);
    expect(failed.body.requestId).toEqual(expect.any(String));
    expect(await rowCounts()).toEqual(before);
    // The feed's retry then succeeds.
    expect((await post(payload)).status).toBe(201);
  });
});

describe("idempotency", () => {
  it("answers 200 with the stored result for the same (source, externalId, revision) and writes nothing", async () => {
    const payload = samplePayload();
    const first = await post(payload);
    const before = await rowCounts();
    clockMs += 5_000;
    const again = await post({ ...payload, networkSnr: 99 });
    expect(again.status).toBe(200);
    expect(again.body).toEqual({ ...first.body, outcome: "duplicate" });
    expect(await rowCounts()).toEqual(before);
  });

  it("answers concurrent duplicates of a new candidate without a 5xx, creating it once", async () => {
    const payload = samplePayload();
    const results = await Promise.all(Array.from({ length: 6 }, () => post(payload)));
    expect(results.map((r) => r.status).sort()).toEqual([200, 200, 200, 200, 200, 201]);
    expect(new Set(results.map((r) => r.body.id)).size).toBe(1);
    const db = await getDb();
    const rows = await db.select().from(candidates).where(eq(candidates.externalId, payload.externalId));
    expect(rows).toHaveLength(1);
  });
});

describe("revisions", () => {
  it("makes a higher revision current and keeps a lower late one in the history only", async () => {
    const base = samplePayload();
    const r1 = await post(base);
    clockMs += 60_000;
    const r3 = await post({ ...base, revision: 3, stage: "revised", networkSnr: 15.1, detectors: ["N1", "S1", "E1"] });
    expect(r3).toMatchObject({ status: 201, body: { id: r1.body.id, revision: 3, outcome: "revised" } });
    clockMs += 60_000;
    const r2 = await post({ ...base, revision: 2, stage: "confirmed", networkSnr: 13.0 });
    expect(r2).toMatchObject({ status: 201, body: { id: r1.body.id, revision: 2, outcome: "stale" } });

    const db = await getDb();
    const [candidate] = await db.select().from(candidates).where(eq(candidates.id, r1.body.id));
    expect(candidate).toMatchObject({ currentRevision: 3, stage: "revised", networkSnr: 15.1, version: 2 });
    expect(candidate?.detectors).toEqual(["N1", "S1", "E1"]);
    const kinds = (await db.select().from(events).where(eq(events.candidateId, r1.body.id)).orderBy(asc(events.id))).map((e) => e.kind);
    expect(kinds).toEqual(["candidate.created", "candidate.revised", "candidate.revision-stale"]);

    const detail = await readCandidate(r1.body.id);
    expect(detail.status).toBe(200);
    expect(detail.body).toMatchObject({ id: r1.body.id, revision: 3, derived: r3.body.derived });
    expect(detail.body.state).toMatchObject({ triageState: "new", stage: "revised", owner: null, acknowledgedAt: null });
    const revisions = detail.body.revisions as Array<{ revision: number; isCurrent: boolean; arrivedLate: boolean; changes: Array<{ field: string }> }>;
    expect(revisions.map((r) => [r.revision, r.isCurrent, r.arrivedLate])).toEqual([
      [1, false, false],
      [2, false, true],
      [3, true, false],
    ]);
    expect(revisions[1]?.changes.map((c) => c.field)).toEqual(["stage", "networkSnr"]);
    expect(revisions[2]?.changes.map((c) => c.field)).toEqual(["stage", "networkSnr", "detectors"]);
    expect(detail.body.payload).toMatchObject({ revision: 3, networkSnr: 15.1 });
  });

  it("GET answers 404 for an unknown id and 401 without a token", async () => {
    expect((await readCandidate("no-such-candidate")).status).toBe(404);
    expect((await readCandidate("no-such-candidate", "")).status).toBe(401);
  });
});

describe("withdrawal", () => {
  it("marks the candidate withdrawn, cancels open/claimed/observing tasks with an event each, and tells the owners", async () => {
    const base = samplePayload();
    const { body } = await post(base);
    const db = await getDb();
    const at = new Date(clockMs);
    const task = (state: "open" | "claimed" | "observing" | "reported", claimedById: string | null) => ({
      candidateId: body.id,
      kind: "galaxy-targeted" as const,
      state,
      claimedById,
      updatedAt: at,
    });
    const inserted = await db
      .insert(followUpTasks)
      .values([task("open", null), task("claimed", observerId), task("observing", observerId), task("reported", observerId)])
      .returning({ id: followUpTasks.id, state: followUpTasks.state });
    clockMs += 120_000;
    const withdrawn = await post({ ...base, revision: 2, stage: "withdrawn" });
    expect(withdrawn.status).toBe(201);

    const [candidate] = await db.select().from(candidates).where(eq(candidates.id, body.id));
    expect(candidate?.stage).toBe("withdrawn");
    expect(candidate?.withdrawnAt?.getTime()).toBe(clockMs);
    const tasks = await db.select().from(followUpTasks).where(eq(followUpTasks.candidateId, body.id));
    const stateOf = (id: string | undefined) => tasks.find((t) => t.id === id)?.state;
    expect(inserted.map((t) => stateOf(t.id))).toEqual(["cancelled", "cancelled", "cancelled", "reported"]);
    expect(tasks.filter((t) => t.state === "cancelled").every((t) => t.cancelledAt?.getTime() === clockMs)).toBe(true);

    const cancelledEvents = await db
      .select()
      .from(events)
      .where(and(eq(events.candidateId, body.id), eq(events.kind, "task.cancelled")));
    expect(cancelledEvents.map((e) => e.fromState).sort()).toEqual(["claimed", "observing", "open"]);
    const [withdrawnEvent] = await db
      .select()
      .from(events)
      .where(and(eq(events.candidateId, body.id), eq(events.kind, "candidate.withdrawn")));
    expect(onTasksCancelled).toHaveBeenCalledTimes(1);
    const info = vi.mocked(onTasksCancelled).mock.calls[0]?.[1];
    expect(info?.ownerIds).toEqual([observerId]);
    expect(info?.taskIds.sort()).toEqual(inserted.slice(0, 3).map((t) => t.id).sort());
    expect(info?.eventId).toBe(withdrawnEvent?.id);

    const detail = await readCandidate(body.id);
    expect(detail.body.tasks.map((t: { state: string }) => t.state).sort()).toEqual(["cancelled", "cancelled", "cancelled", "reported"]);
  });
});
