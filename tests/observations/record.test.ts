import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, observations } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import * as taskObservations from "@/app/api/v1/tasks/[id]/observations/route";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSite, insertTask, observationCounts } from "./helpers";

const NOW_MS = Date.UTC(2030, 2, 20, 6, 0, 0);
const POST = taskObservations.POST.with({ now: () => NOW_MS });
const square = { shape: "rectangle", widthDeg: 2, heightDeg: 2 } as const;
const disc = { shape: "circle", radiusDeg: 1 } as const;

let env: SkymapTestEnv;
const who = {} as Record<"shifter" | "coordinator" | "holder" | "colleague" | "elsewhere" | "admin", Caller>;
let siteA: Awaited<ReturnType<typeof insertSite>>;
let siteB: Awaited<ReturnType<typeof insertSite>>;
let candidateId: string;
let taskA: string; // at site A (one instrument), held by `holder`
let taskB: string; // at site B (two instruments), open
let anySite: string; // no site, open

beforeAll(async () => {
  env = await setupSkymapTest();
  who.shifter = await createCaller("shifter");
  who.coordinator = await createCaller("coordinator");
  who.holder = await createCaller("observer");
  who.colleague = await createCaller("observer");
  who.elsewhere = await createCaller("observer");
  who.admin = await createCaller("admin");
  siteA = await insertSite([square], [who.holder.user.id, who.colleague.user.id]);
  siteB = await insertSite([square, disc], [who.elsewhere.user.id]);
  candidateId = (await insertCandidate()).id;
  taskA = await insertTask(candidateId, { siteId: siteA.id, claimedById: who.holder.user.id });
  taskB = await insertTask(candidateId, { siteId: siteB.id });
  anySite = await insertTask(candidateId, { siteId: null });
});
afterAll(() => env.cleanup());

const row = (extra: Record<string, unknown> = {}) => ({ raDeg: 123.4, decDeg: -35, startTime: "2030-03-20T05:00:00Z", exposureS: 60, filter: "r", ...extra });

function post(caller: Caller | undefined, taskId: string, body: unknown) {
  return call(POST, { caller, params: { id: taskId }, json: body });
}

describe("POST /api/v1/tasks/{id}/observations", () => {
  it("stores every row with the task's instrument and its footprint, answers 201 { accepted, ids } and audits once", async () => {
    const before = await observationCounts();
    const res = await post(who.shifter, taskA, { observations: [row(), row({ raDeg: 125, pointingIndex: 3, limitingMagnitude: 20.2 })] });
    expect(res.status).toBe(201);
    expect(res.json.accepted).toBe(2);
    const ids = res.json.ids as string[];
    expect(ids).toHaveLength(2);
    const db = await getDb();
    const stored = await db.select().from(observations).where(eq(observations.taskId, taskA));
    const [first, second] = ids.map((id) => stored.find((o) => o.id === id));
    expect(first).toMatchObject({ candidateId, instrumentId: siteA.instruments[0]?.id, siteId: siteA.id, footprint: square, raDeg: 123.4, source: "api", recordedById: who.shifter.user.id });
    expect(first?.startTime.toISOString()).toBe("2030-03-20T05:00:00.000Z");
    // no limiting magnitude given → the instrument's (21); given → kept
    expect(first?.limitingMagnitude).toBe(21);
    expect(second).toMatchObject({ raDeg: 125, pointingIndex: 3, limitingMagnitude: 20.2 });
    const after = await observationCounts();
    expect(after.observations - before.observations).toBe(2);
    const audit = (await db.select().from(events).where(eq(events.kind, eventKinds.observationsRecorded))).filter((e) => e.taskId === taskA);
    expect(audit.at(-1)).toMatchObject({ candidateId, actorId: who.shifter.user.id, data: { count: 2, via: "api", siteIds: [siteA.id] } });
  });

  it("a row's own footprint wins over the instrument's; a named instrument of the task's site is used", async () => {
    const res = await post(who.coordinator, taskB, { observations: [row({ instrumentId: siteB.instruments[1]?.id }), row({ instrumentId: siteB.instruments[0]?.id, footprint: disc })] });
    expect(res.status).toBe(201);
    const db = await getDb();
    const [a, b] = await Promise.all((res.json.ids as string[]).map(async (id) => (await db.select().from(observations).where(eq(observations.id, id)))[0]));
    expect(a?.footprint).toEqual(disc);
    expect(a?.instrumentId).toBe(siteB.instruments[1]?.id);
    expect(b?.footprint).toEqual(disc);
    expect(b?.instrumentId).toBe(siteB.instruments[0]?.id);
  });

  const tooMany = Array.from({ length: 1001 }, () => row());
  it.each([
    ["no rows", { observations: [] }, "observations", undefined],
    ["1001 rows", { observations: tooMany }, "observations", undefined],
    ["no observations field", {}, "observations", undefined],
    ["an unknown top-level field", { observations: [row()], extra: 1 }, "extra", undefined],
    ["RA of 360°", { observations: [row(), row({ raDeg: 360 })] }, "raDeg", 2],
    ["Dec of 91°", { observations: [row({ decDeg: 91 })] }, "decDeg", 1],
    ["Dec of −90.5°", { observations: [row(), row(), row({ decDeg: -90.5 })] }, "decDeg", 3],
    ["an exposure of 0 s", { observations: [row({ exposureS: 0 })] }, "exposureS", 1],
    ["an exposure over a day", { observations: [row(), row({ exposureS: 86_401 })] }, "exposureS", 2],
    ["a start more than 1 h ahead", { observations: [row(), row({ startTime: "2030-03-20T07:00:01Z" })] }, "startTime", 2],
    ["a start without a zone", { observations: [row({ startTime: "2030-03-20T05:00:00" })] }, "startTime", 1],
    ["no filter", { observations: [{ raDeg: 1, decDeg: 1, startTime: "2030-03-20T05:00:00Z", exposureS: 60 }] }, "filter", 1],
    ["an unknown row field", { observations: [row({ seeing: 1.2 })] }, "seeing", 1],
    ["a bad footprint", { observations: [row({ footprint: { shape: "circle", radiusDeg: 0 } })] }, "footprint.radiusDeg", 1],
    ["an unknown instrument", { observations: [row(), row({ instrumentId: "no-such-camera" })] }, "instrumentId", 2],
    ["another site's instrument", { observations: [row({ instrumentId: "SITE_B_0" })] }, "instrumentId", 1],
  ])("%s → 422 naming the field (and the row), nothing stored", async (_what, body, field, rowNumber) => {
    const resolved = JSON.parse(JSON.stringify(body).replaceAll("SITE_B_0", siteB.instruments[0]?.id ?? "")) as unknown;
    const before = await observationCounts();
    const res = await post(who.coordinator, taskA, resolved);
    expect(res.status).toBe(422);
    expect(res.json.error).toContain(field);
    if (rowNumber !== undefined) {
      expect(res.json.row).toBe(rowNumber);
      expect(res.json.field).toBe(field);
      expect(res.json.error).toContain(`row ${rowNumber}`);
    }
    expect(await observationCounts()).toEqual(before);
  });

  it("a site with two instruments needs the row to name one (or give a footprint) → 422, nothing stored", async () => {
    const before = await observationCounts();
    const res = await post(who.coordinator, taskB, { observations: [row({ footprint: disc }), row()] });
    expect(res.status).toBe(422);
    expect(res).toMatchObject({ json: { row: 2, field: "instrumentId" } });
    expect(res.json.error).toContain("2 instruments");
    const anyRes = await post(who.coordinator, anySite, { observations: [row()] });
    expect(anyRes.status).toBe(422);
    expect(anyRes.json.field).toBe("instrumentId");
    expect(await observationCounts()).toEqual(before);
  });

  it("answers 404 for an unknown task and stores nothing", async () => {
    const before = await observationCounts();
    expect((await post(who.coordinator, "no-such-task", { observations: [row()] })).status).toBe(404);
    expect(await observationCounts()).toEqual(before);
  });
});

describe("who may record", () => {
  it("the observer holding the task records with the task's instrument", async () => {
    expect((await post(who.holder, taskA, { observations: [row()] })).status).toBe(201);
  });

  it("an observer of the task's site records with that site's instrument without holding the task", async () => {
    expect((await post(who.colleague, taskA, { observations: [row()] })).status).toBe(201);
  });

  it("an observer of another site may not record for a task at a site not theirs (403, nothing stored)", async () => {
    const before = await observationCounts();
    const res = await post(who.elsewhere, taskA, { observations: [row()] });
    expect(res.status).toBe(403);
    expect(res.json.field).toBe("instrumentId");
    expect(await observationCounts()).toEqual(before);
  });

  it("on an any-site task an observer records with their own site's instrument, never with a bare footprint", async () => {
    const before = await observationCounts();
    const bare = await post(who.elsewhere, anySite, { observations: [row({ instrumentId: siteB.instruments[0]?.id }), row({ footprint: disc })] });
    expect(bare.status).toBe(403);
    expect(bare.json.row).toBe(2);
    expect(await observationCounts()).toEqual(before);
    const mine = await post(who.elsewhere, anySite, { observations: [row({ instrumentId: siteB.instruments[0]?.id })] });
    expect(mine.status).toBe(201);
    const other = await post(who.elsewhere, anySite, { observations: [row({ instrumentId: siteA.instruments[0]?.id })] });
    expect(other.status).toBe(403);
  });

  it("shifters and coordinators record for any task, with a bare footprint too", async () => {
    expect((await post(who.shifter, anySite, { observations: [row({ footprint: disc })] })).status).toBe(201);
    expect((await post(who.coordinator, taskB, { observations: [row({ instrumentId: siteB.instruments[0]?.id })] })).status).toBe(201);
  });

  it("an administrator is refused by the route (403); no credentials → 401; nothing stored", async () => {
    const before = await observationCounts();
    expect((await post(who.admin, taskA, { observations: [row()] })).status).toBe(403);
    expect((await post(undefined, taskA, { observations: [row()] })).status).toBe(401);
    expect(await observationCounts()).toEqual(before);
  });

  it("every signed-in role reads a task's log; an unknown task is 404", async () => {
    for (const caller of [who.shifter, who.elsewhere, who.admin]) {
      const res = await call(taskObservations.GET, { caller, params: { id: taskA } });
      expect(res.status).toBe(200);
      expect((res.json.observations as unknown[]).length).toBeGreaterThan(0);
    }
    expect((await call(taskObservations.GET, { caller: who.shifter, params: { id: "no-such-task" } })).status).toBe(404);
  });
});
