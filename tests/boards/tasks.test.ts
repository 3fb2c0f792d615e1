import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, followUpTasks, notifications, siteObservers, sites, taskReports, type Role } from "@/db/schema";
import { GET as candidateTasksGet, POST as createTasksRoute } from "@/app/api/v1/candidates/[id]/tasks/route";
import { POST as claimRoute } from "@/app/api/v1/tasks/[id]/claim/route";
import { POST as reportRoute } from "@/app/api/v1/tasks/[id]/report/route";
import { GET as listRoute } from "@/app/api/v1/tasks/route";
import { POST as stateRoute } from "@/app/api/v1/tasks/[id]/state/route";
import { setPlanningClock } from "@/lib/triage/clock";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, insertCandidate, type Caller } from "./helpers/api";

let testDb: TestDatabase;
const c = {} as Record<Role | "observer2" | "elsewhere", Caller>;
let siteId: string;

// Planning happens the day before the drafts' windows, so the 7-day bound is measured from a fixed instant.
const planningAtMs = Date.parse("2029-12-31T12:00:00Z");

beforeAll(async () => {
  setPlanningClock(() => planningAtMs);
  testDb = await setupTestDatabase();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) c[role] = await createCaller(role);
  c.observer2 = await createCaller("observer", "Second Observer");
  c.elsewhere = await createCaller("observer", "Observer Of No Site Here");
  const db = await getDb();
  const [site] = await db
    .insert(sites)
    .values({ code: "QTR", name: "Quarry Test Range (fictional)", latitudeDeg: -20, longitudeDeg: 30, elevationM: 900, fieldOfViewDeg2: 3 })
    .returning();
  siteId = site?.id ?? "";
  await db.insert(siteObservers).values([{ siteId, userId: c.observer.user.id }, { siteId, userId: c.observer2.user.id }]);
});
afterAll(() => {
  setPlanningClock(null);
  return testDb.cleanup();
});

const draft = (over: Record<string, unknown> = {}) => ({ kind: "galaxy-targeted", siteId, windowStart: "2030-01-01T20:00:00Z", windowEnd: "2030-01-02T04:00:00Z", priority: 1, notes: "bright galaxies first", ...over });

async function openTask(): Promise<string> {
  const id = await insertCandidate({ triageState: "pursue" });
  const res = await callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [draft()] } });
  expect(res.status).toBe(201);
  return (res.json.tasks as Array<{ id: string }>)[0]?.id ?? "";
}

const move = (caller: Caller, id: string, body: Record<string, unknown>) => callRoute(stateRoute, { caller, params: { id }, body });

describe("planning follow-up", () => {
  it("shifters and coordinators create several tasks at once; observers and admins may not", async () => {
    const id = await insertCandidate({ triageState: "pursue" });
    const body = { tasks: [draft(), draft({ kind: "spectroscopy", siteId: null, windowStart: "", windowEnd: "" })] };
    expect((await callRoute(createTasksRoute, { caller: c.observer, params: { id }, body })).status).toBe(403);
    expect((await callRoute(createTasksRoute, { caller: c.admin, params: { id }, body })).status).toBe(403);
    const res = await callRoute(createTasksRoute, { caller: c.coordinator, params: { id }, body });
    expect(res.status).toBe(201);
    const tasks = res.json.tasks as Array<{ state: string; kind: string; windowStart: string | null }>;
    expect(tasks.map((t) => [t.kind, t.state])).toEqual([["galaxy-targeted", "open"], ["spectroscopy", "open"]]);
    expect(tasks[1]?.windowStart).toBeNull();
    const listed = await callRoute(candidateTasksGet, { caller: c.observer, params: { id } });
    expect(Object.keys(listed.json)).toHaveLength(2);
    // A candidate's own list is that candidate's only: "T" is in every test candidate's name, yet names no candidate.
    const fragment = await callRoute(candidateTasksGet, { caller: c.observer, params: { id: "T" } });
    expect(fragment.json).toEqual([]);
  });

  it("refuses a candidate that is not in Pursue, a backwards window and an unknown site", async () => {
    const notYet = await insertCandidate({ triageState: "reviewing" });
    expect((await callRoute(createTasksRoute, { caller: c.shifter, params: { id: notYet }, body: { tasks: [draft()] } })).status).toBe(422);
    const id = await insertCandidate({ triageState: "pursue" });
    const backwards = await callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [draft({ windowEnd: "2029-12-31T00:00:00Z" })] } });
    expect(backwards.status).toBe(422);
    expect(JSON.stringify(backwards.json.issues)).toContain("tasks.0.windowEnd");
    expect((await callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [draft({ siteId: "nowhere" })] } })).status).toBe(422);
    expect((await callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [] } })).status).toBe(422);
  });

  it("refuses an unchosen site and a window more than 7 days ahead, naming the field; null is an explicit any site", async () => {
    const id = await insertCandidate({ triageState: "pursue" });
    const plan = (over: Record<string, unknown>) => callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [draft(over)] } });
    for (const siteless of [{ siteId: "" }, { siteId: undefined }]) {
      const res = await plan(siteless);
      expect(res.status).toBe(422);
      expect(JSON.stringify(res.json.issues)).toContain("tasks.0.siteId");
    }
    const farEnd = await plan({ windowEnd: "2030-01-07T12:00:01Z" });
    expect(farEnd.status).toBe(422);
    expect(JSON.stringify(farEnd.json.issues)).toContain("tasks.0.windowEnd");
    const year9999 = await plan({ windowStart: "9999-12-30T00:00:00Z", windowEnd: "9999-12-31T00:00:00Z" });
    expect(year9999.status).toBe(422);
    expect(JSON.stringify(year9999.json.issues)).toContain("tasks.0.windowStart");
    expect((await plan({ windowEnd: "2030-01-07T12:00:00Z" })).status).toBe(201);
    expect((await plan({ siteId: "any" })).status).toBe(201);
    const db = await getDb();
    const stored = await db.select().from(followUpTasks).where(eq(followUpTasks.candidateId, id));
    expect(stored.map((t) => t.siteId).sort()).toEqual([null, siteId].sort());
  });
});

describe("a task's life", () => {
  it("open → claimed → observing → reported, with an audit event for each step", async () => {
    const id = await openTask();
    expect((await callRoute(claimRoute, { caller: c.shifter, params: { id }, method: "POST" })).status).toBe(403);
    expect((await callRoute(claimRoute, { caller: c.observer, params: { id }, method: "POST" })).status).toBe(200);
    expect((await move(c.observer2, id, { to: "observing" })).status).toBe(403);
    expect((await move(c.observer, id, { to: "observing" })).status).toBe(200);
    expect((await callRoute(reportRoute, { caller: c.observer2, params: { id }, body: { result: "nothing new" } })).status).toBe(403);
    const report = await callRoute(reportRoute, { caller: c.observer, params: { id }, body: { result: "no new source to r = 21.5 mag" } });
    expect(report.status).toBe(200);
    const db = await getDb();
    const [task] = await db.select().from(followUpTasks).where(eq(followUpTasks.id, id));
    expect(task).toMatchObject({ state: "reported", result: "no new source to r = 21.5 mag" });
    expect(task?.observingAt).not.toBeNull();
    const reports = await db.select().from(taskReports).where(eq(taskReports.taskId, id));
    expect(reports).toHaveLength(1);
    const log = await db.select().from(events).where(eq(events.taskId, id));
    expect(log.map((e) => [e.kind, e.fromState, e.toState])).toEqual([
      ["task.created", null, "open"],
      ["task.state-changed", "open", "claimed"],
      ["task.state-changed", "claimed", "observing"],
      ["task.reported", "observing", "reported"],
    ]);
    // Final: nothing moves a reported task.
    expect((await move(c.coordinator, id, { to: "cancelled", reason: "too late" })).status).toBe(409);
  });

  it("the claimer or a coordinator releases a claim; others may not", async () => {
    const id = await openTask();
    await callRoute(claimRoute, { caller: c.observer, params: { id }, method: "POST" });
    expect((await move(c.observer2, id, { to: "open" })).status).toBe(403);
    const released = await move(c.coordinator, id, { to: "open" });
    expect(released.status).toBe(200);
    expect(released.json.task).toMatchObject({ state: "open", claimedById: null });
    expect((await callRoute(claimRoute, { caller: c.observer2, params: { id }, method: "POST" })).status).toBe(200);
  });

  it("shifters cancel with a reason; observers cannot cancel; a cancelled task cannot be claimed", async () => {
    const id = await openTask();
    expect((await move(c.observer, id, { to: "cancelled", reason: "x y z" })).status).toBe(403);
    expect((await move(c.shifter, id, { to: "cancelled" })).status).toBe(422);
    expect((await move(c.shifter, id, { to: "cancelled", reason: "region set at the site" })).status).toBe(200);
    const late = await callRoute(claimRoute, { caller: c.observer, params: { id }, method: "POST" });
    expect(late.status).toBe(409);
    expect(late.json.claimedBy).toBeNull();
    expect((await move(c.shifter, id, { to: "observing" })).status).toBe(403);
  });

  it("an open task cannot jump to observing; an unknown task is 404", async () => {
    const id = await openTask();
    expect((await move(c.coordinator, id, { to: "observing" })).status).toBe(422);
    expect((await callRoute(claimRoute, { caller: c.observer, params: { id: "nope" }, method: "POST" })).status).toBe(404);
  });
});

describe("observers claim tasks at their own sites", () => {
  it("refuses an observer of no such site with a 403 naming the site; any-site tasks and coordinators may", async () => {
    const id = await openTask();
    const refused = await callRoute(claimRoute, { caller: c.elsewhere, params: { id }, method: "POST" });
    expect(refused.status).toBe(403);
    expect(refused.json.error).toContain("QTR");
    const db = await getDb();
    const [untouched] = await db.select().from(followUpTasks).where(eq(followUpTasks.id, id));
    expect(untouched).toMatchObject({ state: "open", claimedById: null });
    expect((await callRoute(claimRoute, { caller: c.coordinator, params: { id }, method: "POST" })).status).toBe(200);

    const candidateId = await insertCandidate({ triageState: "pursue" });
    const anySite = await callRoute(createTasksRoute, { caller: c.shifter, params: { id: candidateId }, body: { tasks: [draft({ siteId: null })] } });
    const anyId = (anySite.json.tasks as Array<{ id: string }>)[0]?.id ?? "";
    expect((await callRoute(claimRoute, { caller: c.elsewhere, params: { id: anyId }, method: "POST" })).status).toBe(200);
  });
});

describe("the follow-up board's filters", () => {
  it("filters by site, kind, candidate and mine", async () => {
    const id = await openTask();
    await callRoute(claimRoute, { caller: c.observer2, params: { id }, method: "POST" });
    const list = async (query: string, caller = c.observer2) =>
      (await callRoute(listRoute, { caller, url: `http://localhost/api/v1/tasks?${query}` })).json as unknown as Array<{ id: string; claimedBy: { id: string } | null; kind: string }>;
    const mine = await list("mine=1");
    expect(mine.length).toBeGreaterThan(0);
    expect(mine.every((t) => t.claimedBy?.id === c.observer2.user.id)).toBe(true);
    const spectroscopy = await list("kind=spectroscopy");
    expect(spectroscopy.length).toBeGreaterThan(0);
    expect(spectroscopy.every((t) => t.kind === "spectroscopy")).toBe(true);
    expect((await list("site=QTR")).some((t) => t.id === id)).toBe(true);
    expect(await list("site=NOPE")).toEqual([]);
    const db = await getDb();
    const [task] = await db.select().from(followUpTasks).where(eq(followUpTasks.id, id));
    expect((await list(`candidate=${task?.candidateId}`)).map((t) => t.id)).toEqual([id]);
    expect((await callRoute(listRoute, { caller: c.observer, url: "http://localhost/api/v1/tasks?kind=bogus" })).status).toBe(422);
  });
});

describe("observers hear about new tasks at their sites", () => {
  it("queues a task message for the site's observer in the same transaction as the tasks, and none for others", async () => {
    const db = await getDb();
    const id = await insertCandidate({ triageState: "pursue" });
    const res = await callRoute(createTasksRoute, { caller: c.shifter, params: { id }, body: { tasks: [draft(), draft({ kind: "spectroscopy" })] } });
    expect(res.status).toBe(201);
    const rows = await db.select().from(notifications).where(and(eq(notifications.candidateId, id), eq(notifications.kind, "task-created")));
    expect(new Set(rows.map((r) => r.userId))).toEqual(new Set([c.observer.user.id, c.observer2.user.id]));
    expect(rows.find((r) => r.channel === "in-app")?.body).toMatch(/^New tasks:\n(.*\n)*• Galaxy-targeted imaging at QTR · /);
    expect(rows.find((r) => r.channel === "in-app")?.body).toMatch(/\n• Spectroscopy at QTR · /);
  });
});
