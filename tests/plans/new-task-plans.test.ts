import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listTasks } from "@/lib/data/tasks";
import { uploadSkymap } from "@/lib/data/skymaps";
import { setPlanningClock } from "@/lib/triage/clock";
import * as tasksRoute from "@/app/api/v1/candidates/[id]/tasks/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let wide: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
let slit: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const window = { windowStart: "2030-03-20T23:00:00Z", windowEnd: "2030-03-21T01:00:00Z" };

beforeAll(async () => {
  env = await setupSkymapTest();
  setPlanningClock(() => NOW.getTime());
  shifter = await createCaller("shifter");
  wide = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, footprint: { shape: "rectangle", widthDeg: 10, heightDeg: 10 } });
  // a 0.05 deg² slit would need thousands of pointings for the ~1400 deg² region: planned by hand, not on creation
  slit = await insertSiteWithInstrument({ latitudeDeg: -25, longitudeDeg: 20, footprint: { shape: "circle", radiusDeg: 0.126 } });
});
afterAll(async () => {
  setPlanningClock(null);
  await env.cleanup();
});

async function pursuedCandidate(withMap: boolean) {
  const id = (await insertCandidate({ triageState: "pursue", receivedAt: NOW })).id;
  if (withMap) await uploadSkymap({ target: { candidateId: id }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-nested-n64.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
  return id;
}

describe("planning a follow-up task for a site attaches a plan", () => {
  it("plans the site's instrument in the task's window, no more pointings than the window holds; any-site and slit tasks get none", async () => {
    const id = await pursuedCandidate(true);
    const res = await call(tasksRoute.POST, {
      caller: shifter,
      params: { id },
      json: { tasks: [{ kind: "wide-field-tiling", siteId: wide.site.id, ...window }, { kind: "galaxy-targeted", siteId: "any" }, { kind: "spectroscopy", siteId: slit.site.id, ...window }] },
    });
    expect(res.status).toBe(201);
    const tasks = res.json.tasks as Array<{ id: string; siteId: string | null }>;
    const plans = res.json.plans as Array<{ taskId: string; pointings: number }>;
    const wideTask = tasks.find((t) => t.siteId === wide.site.id);
    expect(plans.map((p) => p.taskId)).toEqual([wideTask?.id]);
    // 2 h window, 300 s exposures + 60 s overhead: at most 20 pointings
    expect(plans[0]?.pointings).toBeGreaterThan(0);
    expect(plans[0]?.pointings).toBeLessThanOrEqual(20);
    const cards = await listTasks({ candidateId: id }, shifter.user);
    expect(cards.filter((c) => c.plan).map((c) => c.id)).toEqual([wideTask?.id]);
  });

  it("a candidate without a sky map gets its tasks and no plans", async () => {
    const id = await pursuedCandidate(false);
    const res = await call(tasksRoute.POST, { caller: shifter, params: { id }, json: { tasks: [{ kind: "wide-field-tiling", siteId: wide.site.id, ...window }] } });
    expect(res.status).toBe(201);
    expect(res.json.plans).toEqual([]);
    expect((res.json.tasks as unknown[]).length).toBe(1);
  });
});
