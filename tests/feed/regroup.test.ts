import { NextRequest } from "next/server";
import { asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as postMerge } from "@/app/api/v1/candidates/[id]/merge/route";
import { POST as postSplit } from "@/app/api/v1/candidates/[id]/triggers/[triggerId]/split/route";
import { getDb } from "@/db";
import { candidates, events, triggers } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { getBoard, listCandidates } from "@/lib/data/candidates";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import type { FeedCandidate } from "@/lib/validations/feed";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, samplePayload, setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
const clockMs = Date.UTC(2026, 11, 1, 4, 13, 0);
const route = feedIngest.with({ now: () => clockMs });
const tokens = { coordinator: "", shifter: "" };

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  tokens.coordinator = (await createApiToken((await createTestUser("coordinator")).id, "t")).token;
  tokens.shifter = (await createApiToken((await createTestUser("shifter")).id, "t")).token;
});
afterAll(() => testDb.cleanup());

async function post(payload: FeedCandidate) {
  const res = await route(feedRequest(JSON.stringify(payload), { nowMs: clockMs }));
  const body = (await res.json()) as { id: string; triggerId: string; outcome: string };
  return { ...body, externalId: payload.externalId };
}

async function call(kind: "split" | "merge", params: Record<string, string>, body?: unknown, as: keyof typeof tokens = "coordinator") {
  const req = new NextRequest("http://localhost/api/v1/x", {
    method: "POST",
    headers: { authorization: `Bearer ${tokens[as]}`, "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const ctx = { params: Promise.resolve(params) };
  const res = kind === "split" ? await postSplit(req, ctx as never) : await postMerge(req, ctx as never);
  return { status: res.status, body: (await res.json()) as Record<string, unknown> & { toCandidateId: string; triggerIds: string[] } };
}

async function triggersOf(candidateId: string) {
  const rows = await (await getDb()).select().from(triggers).where(eq(triggers.candidateId, candidateId)).orderBy(asc(triggers.source));
  return rows.map((t) => t.source);
}

async function candidate(id: string) {
  const [row] = await (await getDb()).select().from(candidates).where(eq(candidates.id, id));
  return row;
}

let signalMs = Date.UTC(2026, 11, 1, 6, 0, 0);
function nextSignal() {
  signalMs += 60_000;
  const base = signalMs;
  return (offsetMs: number) => new Date(base + offsetMs).toISOString();
}

describe("splitting a trigger out", () => {
  it("makes it a candidate of its own, audited on both; merging it back undoes it", async () => {
    const at = nextSignal();
    const a = await post(samplePayload({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.001 }));
    const b = await post(samplePayload({ source: "pipe-b", eventTime: at(400), falseAlarmRatePerYear: 0.1 }));
    expect(b.id).toBe(a.id);
    const split = await call("split", { id: a.id, triggerId: a.triggerId });
    expect(split.status).toBe(200);
    const newId = split.body.toCandidateId;
    expect(newId).not.toBe(a.id);
    expect(await triggersOf(a.id)).toEqual(["pipe-b"]);
    expect(await triggersOf(newId)).toEqual(["pipe-a"]);
    // The old candidate's preferred trigger is chosen again from what is left.
    expect(await candidate(a.id)).toMatchObject({ preferredTriggerId: b.triggerId, source: "pipe-b", triggerCount: 1 });
    expect(await candidate(newId)).toMatchObject({ preferredTriggerId: a.triggerId, triageState: "new", triggerCount: 1, mergedIntoId: null });
    const db = await getDb();
    for (const id of [a.id, newId]) {
      const kinds = (await db.select().from(events).where(eq(events.candidateId, id))).map((e) => e.kind);
      expect(kinds).toContain("candidate.trigger-split");
    }

    const back = await call("merge", { id: a.id }, { candidateId: newId });
    expect(back.status).toBe(200);
    expect(await triggersOf(a.id)).toEqual(["pipe-a", "pipe-b"]);
    expect(await candidate(a.id)).toMatchObject({ preferredTriggerId: a.triggerId, triggerCount: 2 });
    expect(await candidate(newId)).toMatchObject({ mergedIntoId: a.id, triggerCount: 0 });
  });

  it("refuses the only trigger (409), a trigger of another candidate (404) and a shifter (403)", async () => {
    const at = nextSignal();
    const lone = await post(samplePayload({ source: "pipe-a", eventTime: at(0) }));
    expect((await call("split", { id: lone.id, triggerId: lone.triggerId })).status).toBe(409);
    const other = await post(samplePayload({ source: "pipe-a", eventTime: at(30_000) }));
    expect((await call("split", { id: lone.id, triggerId: other.triggerId })).status).toBe(404);
    await post(samplePayload({ source: "pipe-b", eventTime: at(100) }));
    expect((await call("split", { id: lone.id, triggerId: lone.triggerId }, undefined, "shifter")).status).toBe(403);
    expect((await call("merge", { id: lone.id }, { candidateId: other.id }, "shifter")).status).toBe(403);
  });
});

describe("merging two candidates", () => {
  it("moves every trigger, hides the merged one from board and list, and a split returns them to it", async () => {
    const at = nextSignal();
    const x = await post(samplePayload({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.5 }));
    // 3 s apart: outside the window, so two candidates the coordinator judges to be one signal.
    const y1 = await post(samplePayload({ source: "pipe-b", eventTime: at(3_000), falseAlarmRatePerYear: 0.01 }));
    const y2 = await post(samplePayload({ source: "pipe-c", eventTime: at(3_200), falseAlarmRatePerYear: 0.2 }));
    expect(y2.id).toBe(y1.id);
    expect(y1.id).not.toBe(x.id);
    const merged = await call("merge", { id: x.id }, { candidateId: y1.id });
    expect(merged.status).toBe(200);
    expect(merged.body.triggerIds.sort()).toEqual([y1.triggerId, y2.triggerId].sort());
    expect(await triggersOf(x.id)).toEqual(["pipe-a", "pipe-b", "pipe-c"]);
    expect(await candidate(x.id)).toMatchObject({ preferredTriggerId: y1.triggerId, falseAlarmRatePerYear: 0.01, triggerCount: 3 });
    const board = await getBoard(new Date(clockMs));
    expect(board.cards.map((c) => c.id)).toContain(x.id);
    expect(board.cards.map((c) => c.id)).not.toContain(y1.id);
    expect(board.cards.find((c) => c.id === x.id)?.triggerCount).toBe(3);
    const list = await listCandidates({ state: [], stage: [], class: [], sort: "receivedAt", dir: "desc", page: 1, pageSize: 200 });
    expect(list.rows.map((r) => r.id)).not.toContain(y1.id);
    // A search by a trigger's own id that is not the preferred one's finds the candidate holding it.
    const byTrigger = await listCandidates({ state: [], stage: [], class: [], q: y2.externalId, sort: "receivedAt", dir: "desc", page: 1, pageSize: 25 });
    expect(byTrigger.rows.map((r) => r.id)).toEqual([x.id]);
    // Merging into or from a merged candidate is refused.
    expect((await call("merge", { id: y1.id }, { candidateId: x.id })).status).toBe(409);
    expect((await call("merge", { id: x.id }, { candidateId: x.id })).status).toBe(422);

    // Undo: splitting one trigger of that merge returns both to the merged candidate, revived with its own id.
    const undo = await call("split", { id: x.id, triggerId: y2.triggerId });
    expect(undo.status).toBe(200);
    expect(undo.body).toMatchObject({ toCandidateId: y1.id, returnedToMergedCandidate: true });
    expect(await triggersOf(x.id)).toEqual(["pipe-a"]);
    expect(await triggersOf(y1.id)).toEqual(["pipe-b", "pipe-c"]);
    expect(await candidate(y1.id)).toMatchObject({ mergedIntoId: null, triggerCount: 2, preferredTriggerId: y1.triggerId });
    expect(await candidate(x.id)).toMatchObject({ preferredTriggerId: x.triggerId, falseAlarmRatePerYear: 0.5, triggerCount: 1 });
  });
});
