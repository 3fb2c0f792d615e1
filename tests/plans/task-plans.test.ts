import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, siteObservers } from "@/db/schema";
import { listTasks } from "@/lib/data/tasks";
import { uploadSkymap } from "@/lib/data/skymaps";
import { eventKinds } from "@/lib/events/kinds";
import { claimTask } from "@/lib/services/claim-task";
import { createTasks } from "@/lib/services/create-tasks";
import { moveTask } from "@/lib/services/move-task";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import * as planRoute from "@/app/api/v1/plans/[id]/route";
import * as tickRoute from "@/app/api/v1/plans/[id]/pointings/[pointingId]/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, type PlanAnswer } from "./helpers";

let env: SkymapTestEnv;
const callers = {} as Record<"shifter" | "observer" | "outsider" | "coordinator", Caller>;
let candidateId: string;
let otherCandidateId: string;
let west: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
let east: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const LATER = new Date(NOW.getTime() + 3_600_000);
const windowStart = new Date(Date.UTC(2030, 2, 20, 23, 0, 0));
const windowEnd = new Date(Date.UTC(2030, 2, 21, 9, 0, 0));

const post = (caller: Caller, body: Record<string, unknown>, id = candidateId) =>
  call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller, params: { id }, json: body });
const tick = (caller: Caller, planId: string, pointingId: string, body: unknown) =>
  call(tickRoute.PATCH.with({ now: () => LATER.getTime() }), { caller, method: "PATCH", params: { id: planId, pointingId }, json: body });

async function newTask(siteId: string, candidate = candidateId) {
  const [task] = await createTasks(callers.coordinator.user, candidate, [{ kind: "wide-field-tiling", siteId, windowStart, windowEnd, priority: 2, notes: "" }], NOW);
  if (!task) throw new Error("no task");
  return task;
}

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator"] as const) callers[role] = await createCaller(role);
  callers.outsider = await createCaller("observer");
  const wide = { shape: "rectangle", widthDeg: 10, heightDeg: 10 } as const;
  west = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, footprint: wide, observerIds: [callers.observer.user.id] });
  east = await insertSiteWithInstrument({ latitudeDeg: -31, longitudeDeg: 117, footprint: wide });
  candidateId = (await insertCandidate({ triageState: "pursue", receivedAt: NOW })).id;
  otherCandidateId = (await insertCandidate({ triageState: "pursue", receivedAt: NOW })).id;
  await uploadSkymap({ target: { candidateId }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-nested-n64.fits.gz"), actorId: callers.shifter.user.id, via: "ui", now: NOW });
});
afterAll(() => env.cleanup());

describe("a plan attached to a follow-up task", () => {
  it("takes the task's window, shows on the task card, and a new plan for the task replaces the old one", async () => {
    const task = await newTask(west.site.id);
    const res = await post(callers.shifter, { instrumentId: west.instrument.id, taskId: task.id, maxPointings: 6 });
    expect(res.status).toBe(201);
    const plan = res.json as unknown as PlanAnswer;
    expect(plan.taskId).toBe(task.id);
    expect(plan.window).toEqual({ start: windowStart.toISOString(), end: windowEnd.toISOString() });
    const [card] = await listTasks({ taskId: task.id }, callers.shifter.user);
    const scheduled = plan.pointings.filter((p) => p.plannedStart).length;
    expect(card?.plan).toEqual({ planId: plan.id, pointings: plan.pointings.length, scheduled, done: 0, scheduledProbability: plan.scheduledProbability });

    const again = (await post(callers.shifter, { instrumentId: west.instrument.id, taskId: task.id, maxPointings: 4 })).json as unknown as PlanAnswer;
    expect(again.avoidedProbability).toBe(0); // the task's own earlier plan is replaced, not avoided
    const old = await call(planRoute.GET, { caller: callers.shifter, params: { id: plan.id } });
    expect(old.json.closedAt).toBe(NOW.toISOString());
    const [after] = await listTasks({ taskId: task.id }, callers.shifter.user);
    expect(after?.plan?.planId).toBe(again.id);
  });

  it("refuses another candidate's task (422 taskId), another site's instrument (422 instrumentId), an unknown task (404), a cancelled one (409)", async () => {
    const task = await newTask(west.site.id);
    const foreign = await newTask(east.site.id, otherCandidateId);
    const wrongCandidate = await post(callers.shifter, { instrumentId: east.instrument.id, taskId: foreign.id });
    expect(wrongCandidate.status).toBe(422);
    expect((wrongCandidate.json.issues as Array<{ path: string }>).map((i) => i.path)).toEqual(["taskId"]);
    const wrongSite = await post(callers.shifter, { instrumentId: east.instrument.id, taskId: task.id });
    expect(wrongSite.status).toBe(422);
    expect((wrongSite.json.issues as Array<{ path: string }>).map((i) => i.path)).toEqual(["instrumentId"]);
    expect((await post(callers.shifter, { instrumentId: west.instrument.id, taskId: "no-such-task" })).status).toBe(404);
    await moveTask({ actor: callers.coordinator.user, taskId: task.id, to: "cancelled", reason: "weather", now: NOW });
    expect((await post(callers.shifter, { instrumentId: west.instrument.id, taskId: task.id })).status).toBe(409);
  });

  it("cancelling a task closes its plan, so other plans no longer avoid its sky", async () => {
    const fresh = (await insertCandidate({ triageState: "pursue", receivedAt: NOW })).id;
    await uploadSkymap({ target: { candidateId: fresh }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-nested-n64.fits.gz"), actorId: callers.shifter.user.id, via: "ui", now: NOW });
    const task = await newTask(west.site.id, fresh);
    const tasked = (await post(callers.shifter, { instrumentId: west.instrument.id, taskId: task.id, maxPointings: 3 }, fresh)).json as unknown as PlanAnswer;
    const second = (await post(callers.shifter, { instrumentId: east.instrument.id, maxPointings: 2 }, fresh)).json as unknown as PlanAnswer;
    expect(second.avoidedProbability).toBeCloseTo(tasked.totalProbability, 12); // same map: the first plan's union
    await moveTask({ actor: callers.coordinator.user, taskId: task.id, to: "cancelled", reason: "clouds", now: NOW });
    expect((await call(planRoute.GET, { caller: callers.shifter, params: { id: tasked.id } })).json.closedAt).toBe(NOW.toISOString());
    const third = (await post(callers.shifter, { instrumentId: east.instrument.id, maxPointings: 1 }, fresh)).json as unknown as PlanAnswer;
    expect(third.avoidedProbability).toBeCloseTo(second.totalProbability, 12); // only the plan still open
  });
});

describe("PATCH /api/v1/plans/{id}/pointings/{pointingId}", () => {
  let plan: PlanAnswer;
  let taskId: string;

  beforeAll(async () => {
    taskId = (await newTask(west.site.id)).id;
    plan = (await post(callers.shifter, { instrumentId: west.instrument.id, taskId, maxPointings: 3, avoid: "none" })).json as unknown as PlanAnswer;
  });

  it("an observer at the site ticks a pointing done, audited once, and takes it back", async () => {
    const target = plan.pointings[0];
    if (!target) throw new Error("no pointing");
    const done = await tick(callers.observer, plan.id, target.id, { done: true });
    expect(done.status).toBe(200);
    expect(done.json.pointing).toMatchObject({ id: target.id, index: 1, doneAt: LATER.toISOString(), doneBy: { id: callers.observer.user.id } });
    expect((await tick(callers.observer, plan.id, target.id, { done: true })).status).toBe(200); // a repeat changes nothing
    const [card] = await listTasks({ taskId }, callers.observer.user);
    expect(card?.plan?.done).toBe(1);
    const undone = await tick(callers.coordinator, plan.id, target.id, { done: false });
    expect(undone.json.pointing).toMatchObject({ doneAt: null, doneBy: null });
    const db = await getDb();
    const logged = (await db.select().from(events).where(eq(events.kind, eventKinds.pointingDone))).filter((e) => (e.data as { pointingId?: string }).pointingId === target.id);
    expect(logged.map((e) => [(e.data as { done: boolean }).done, e.actorId, e.taskId])).toEqual([
      [true, callers.observer.user.id, taskId],
      [false, callers.coordinator.user.id, taskId],
    ]);
  });

  it("refuses shifters and observers of other sites (403); the task's holder may tick after leaving the site", async () => {
    const target = plan.pointings[1];
    if (!target) throw new Error("no pointing");
    expect((await tick(callers.shifter, plan.id, target.id, { done: true })).status).toBe(403);
    expect((await tick(callers.outsider, plan.id, target.id, { done: true })).status).toBe(403);
    await claimTask(callers.observer.user, taskId, NOW);
    const db = await getDb();
    await db.delete(siteObservers).where(and(eq(siteObservers.siteId, west.site.id), eq(siteObservers.userId, callers.observer.user.id)));
    expect((await tick(callers.observer, plan.id, target.id, { done: true })).status).toBe(200);
    expect((await tick(callers.outsider, plan.id, target.id, { done: false })).status).toBe(403);
  });

  it("404 for an unknown pointing or one of another plan, 422 naming done, 409 on a replaced plan", async () => {
    const target = plan.pointings[2];
    if (!target) throw new Error("no pointing");
    expect((await tick(callers.coordinator, plan.id, "no-such-pointing", { done: true })).status).toBe(404);
    expect((await tick(callers.coordinator, "another-plan", target.id, { done: true })).status).toBe(404);
    const bad = await tick(callers.coordinator, plan.id, target.id, { done: "yes" });
    expect(bad.status).toBe(422);
    expect((bad.json.issues as Array<{ path: string }>).map((i) => i.path)).toEqual(["done"]);
    await post(callers.shifter, { instrumentId: west.instrument.id, taskId, maxPointings: 1 });
    const closed = await tick(callers.coordinator, plan.id, target.id, { done: true });
    expect(closed.status).toBe(409);
    expect((await call(planRoute.GET, { caller: callers.shifter, params: { id: plan.id } })).json.pointings).toMatchObject([{}, {}, { doneAt: null }]);
  });
});
