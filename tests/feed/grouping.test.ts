import { NextRequest } from "next/server";
import { asc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getCandidate } from "@/app/api/v1/candidates/[id]/route";
import { getDb } from "@/db";
import { candidates, events, triggers } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import type { FeedCandidate } from "@/lib/validations/feed";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, samplePayload, setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
const clockMs = Date.UTC(2026, 11, 1, 4, 13, 0);
const route = feedIngest.with({ now: () => clockMs });
let token = "";

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  token = (await createApiToken((await createTestUser("observer")).id, "test")).token;
});
afterAll(() => testDb.cleanup());

async function post(payload: FeedCandidate) {
  const res = await route(feedRequest(JSON.stringify(payload), { nowMs: clockMs }));
  return { status: res.status, body: (await res.json()) as Record<string, unknown> & { id: string; triggerId: string } };
}

async function detail(id: string) {
  const req = new NextRequest(`http://localhost/api/v1/candidates/${id}`, { headers: { authorization: `Bearer ${token}` } });
  return (await (await getCandidate(req, { params: Promise.resolve({ id }) })).json()) as Record<string, unknown> & {
    triggers: Array<Record<string, unknown>>;
  };
}

/** Event times for one test's signals, far from every other test's (samplePayload's own run 10 s apart before 04:12). */
let signalBaseMs = Date.UTC(2026, 11, 1, 5, 0, 0);
function signalAt(): (offsetMs: number) => string {
  signalBaseMs += 60_000;
  const base = signalBaseMs;
  return (offsetMs) => new Date(base + offsetMs).toISOString();
}

describe("grouping by event time (window ±1 s, edge included)", () => {
  it("joins a trigger inside the window and one exactly at its edge; a trigger just beyond makes its own candidate", async () => {
    const at = signalAt();
    const first = await post(samplePayload({ source: "pipe-a", eventTime: at(0) }));
    const inside = await post(samplePayload({ source: "pipe-b", eventTime: at(300) }));
    const edge = await post(samplePayload({ source: "pipe-c", eventTime: at(-1_000) }));
    // 1.001 s after pipe-a's and 2.001 s after pipe-c's: outside both.
    const beyond = await post(samplePayload({ source: "pipe-d", eventTime: at(1_301) }));
    expect(first).toMatchObject({ status: 201, body: { outcome: "created", preferred: true } });
    expect(inside).toMatchObject({ status: 201, body: { outcome: "joined", id: first.body.id } });
    expect(edge).toMatchObject({ status: 201, body: { outcome: "joined", id: first.body.id } });
    expect(beyond.body).toMatchObject({ outcome: "created", preferred: true });
    expect(beyond.body.id).not.toBe(first.body.id);
    expect(new Set([first.body.triggerId, inside.body.triggerId, edge.body.triggerId]).size).toBe(3);
    const [row] = await (await getDb()).select().from(candidates).where(eq(candidates.id, first.body.id));
    expect(row?.triggerCount).toBe(3);
  });

  it("measured from any live trigger of the candidate, not only its first", async () => {
    const at = signalAt();
    const first = await post(samplePayload({ source: "pipe-a", eventTime: at(0) }));
    await post(samplePayload({ source: "pipe-b", eventTime: at(900) }));
    // 1.8 s from pipe-a's but 0.9 s from pipe-b's
    const third = await post(samplePayload({ source: "pipe-c", eventTime: at(1_800) }));
    expect(third.body).toMatchObject({ outcome: "joined", id: first.body.id });
  });

  it("never joins a withdrawn candidate", async () => {
    const at = signalAt();
    const gone = await post(samplePayload({ source: "pipe-a", eventTime: at(0), stage: "withdrawn" }));
    const next = await post(samplePayload({ source: "pipe-b", eventTime: at(100) }));
    expect(next.body.outcome).toBe("created");
    expect(next.body.id).not.toBe(gone.body.id);
  });
});

describe("the preferred trigger", () => {
  it("changes when a trigger with a lower false-alarm rate joins: headline, answer, API list and timeline follow", async () => {
    const at = signalAt();
    const a = await post(samplePayload({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.5, networkSnr: 20 }));
    const bPayload = samplePayload({ source: "pipe-b", eventTime: at(120), falseAlarmRatePerYear: 0.002, networkSnr: 11 });
    const b = await post(bPayload);
    const c = await post(samplePayload({ source: "pipe-c", eventTime: at(-80), falseAlarmRatePerYear: 0.002, networkSnr: 10 }));
    expect(b.body).toMatchObject({ outcome: "joined", preferred: true });
    // Same rate as pipe-b, lower SNR: not preferred.
    expect(c.body).toMatchObject({ outcome: "joined", preferred: false });
    const d = await detail(a.body.id);
    expect(d).toMatchObject({ source: "pipe-b", externalId: bPayload.externalId });
    expect((d.headline as Record<string, unknown>).falseAlarmRatePerYear).toBe(0.002);
    expect(d.triggers.map((t) => [t.source, t.preferred])).toEqual([
      ["pipe-a", false],
      ["pipe-b", true],
      ["pipe-c", false],
    ]);
    expect(Object.keys(d.triggers[0] ?? {})).toEqual(
      expect.arrayContaining(["id", "source", "externalId", "revision", "eventTime", "networkSnr", "falseAlarmRatePerYear", "preferred", "receivedAt"]),
    );
    // The derived quantities are the preferred trigger's.
    expect(d.derived).toEqual(b.body.derived);
    const log = await (await getDb()).select().from(events).where(eq(events.candidateId, a.body.id)).orderBy(asc(events.id));
    const kinds = log.map((e) => e.kind);
    expect(kinds.filter((k) => k === "candidate.trigger-joined")).toHaveLength(2);
    const changed = log.filter((e) => e.kind === "candidate.preferred-changed");
    expect(changed).toHaveLength(1);
    expect(changed[0]?.data).toMatchObject({ fromTriggerId: a.body.triggerId, toTriggerId: b.body.triggerId, rule: "lowest-far" });
  });

  it("moves when the preferred trigger's own revision raises its false-alarm rate", async () => {
    const at = signalAt();
    const aPayload = samplePayload({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.01 });
    const a = await post(aPayload);
    const b = await post(samplePayload({ source: "pipe-b", eventTime: at(50), falseAlarmRatePerYear: 0.1 }));
    expect(b.body.preferred).toBe(false);
    const revised = await post({ ...aPayload, revision: 2, falseAlarmRatePerYear: 1 });
    expect(revised.body).toMatchObject({ outcome: "revised", id: a.body.id, triggerId: a.body.triggerId, preferred: false });
    const [row] = await (await getDb()).select().from(candidates).where(eq(candidates.id, a.body.id));
    expect(row).toMatchObject({ preferredTriggerId: b.body.triggerId, source: "pipe-b", falseAlarmRatePerYear: 0.1, currentRevision: 1 });
  });
});

describe("idempotency and revisions per trigger", () => {
  it("answers a repeat of a joined trigger's revision as a duplicate of that trigger, writing nothing", async () => {
    const at = signalAt();
    await post(samplePayload({ source: "pipe-a", eventTime: at(0) }));
    const joined = samplePayload({ source: "pipe-b", eventTime: at(10) });
    const first = await post(joined);
    const again = await post(joined);
    expect(again).toMatchObject({
      status: 200,
      body: { outcome: "duplicate", id: first.body.id, triggerId: first.body.triggerId, derived: first.body.derived },
    });
    expect(await (await getDb()).select().from(triggers).where(eq(triggers.candidateId, first.body.id))).toHaveLength(2);
  });
});

describe("withdrawal per trigger", () => {
  it("keeps the candidate while another trigger is live, and withdraws it with the last one", async () => {
    const at = signalAt();
    const a = samplePayload({ source: "pipe-a", eventTime: at(0), falseAlarmRatePerYear: 0.001 });
    const b = samplePayload({ source: "pipe-b", eventTime: at(200), falseAlarmRatePerYear: 0.05 });
    const first = await post(a);
    await post(b);
    const outA = await post({ ...a, revision: 2, stage: "withdrawn" });
    expect(outA.body).toMatchObject({ outcome: "revised", preferred: false });
    const db = await getDb();
    const [live] = await db.select().from(candidates).where(eq(candidates.id, first.body.id));
    expect(live).toMatchObject({ withdrawnAt: null, source: "pipe-b", stage: "first-look", falseAlarmRatePerYear: 0.05 });
    expect((await db.select().from(events).where(eq(events.candidateId, first.body.id))).map((e) => e.kind)).not.toContain("candidate.withdrawn");
    await post({ ...b, revision: 2, stage: "withdrawn" });
    const [gone] = await db.select().from(candidates).where(eq(candidates.id, first.body.id));
    expect(gone?.withdrawnAt?.getTime()).toBe(clockMs);
    expect(gone?.stage).toBe("withdrawn");
    const kinds = (await db.select().from(events).where(eq(events.candidateId, first.body.id))).map((e) => e.kind);
    expect(kinds.filter((k) => k === "candidate.withdrawn")).toHaveLength(1);
  });
});
