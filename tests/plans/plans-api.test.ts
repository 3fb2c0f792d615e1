import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events } from "@/db/schema";
import { sunAltitudeDeg } from "@/lib/astro";
import { eventKinds } from "@/lib/events/kinds";
import { uploadSkymap } from "@/lib/data/skymaps";
import { footprintPixels, loadSkymap, placeFootprint, type Footprint } from "@/lib/skymap";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import * as planRoute from "@/app/api/v1/plans/[id]/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, planRowCounts, type PlanAnswer } from "./helpers";

let env: SkymapTestEnv;
const callers = {} as Record<"shifter" | "observer" | "outsider" | "coordinator" | "admin", Caller>;
let withMap: string;
let withoutMap: string;
let west: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
let east: Awaited<ReturnType<typeof insertSiteWithInstrument>>;
// An injected clock: 2030 March equinox, noon UTC.
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const wide: Footprint = { shape: "rectangle", widthDeg: 10, heightDeg: 10 };
// The bimodal fixture (tests/fixtures/scripts/skymap_make_fixtures.py): its 90 % region spans about 1360 deg²
// at RA 115°–160°, Dec −45°…−10°, well placed in March evenings from southern latitudes.
const map = loadSkymap(fixtureBytes("bimodal-multiorder.fits.gz")).map;

const post = (caller: Caller | undefined, body: Record<string, unknown>, candidateId = withMap) =>
  call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller, params: { id: candidateId }, json: body });

/** Probability of the union of footprints, from the map's pixels (the footprint module is checked against healpy). */
function unionOf(tiles: Array<{ raDeg: number; decDeg: number; footprint: Footprint }>): number {
  const seen = new Set<number>();
  for (const t of tiles) for (const i of footprintPixels(map, placeFootprint(t.footprint, t.raDeg, t.decDeg))) seen.add(i);
  let sum = 0;
  for (const i of seen) sum += map.probability[i] ?? 0;
  return sum;
}

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) callers[role] = await createCaller(role);
  callers.outsider = await createCaller("observer");
  west = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, timeZone: "Etc/GMT+4", footprint: wide, observerIds: [callers.observer.user.id] });
  east = await insertSiteWithInstrument({ latitudeDeg: -31, longitudeDeg: 117, footprint: wide });
  withMap = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 3_600_000) })).id;
  withoutMap = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 1_800_000) })).id;
  await uploadSkymap({ target: { candidateId: withMap }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: callers.shifter.user.id, via: "ui", now: NOW });
});
afterAll(() => env.cleanup());

describe("POST /api/v1/candidates/{id}/plans", () => {
  let first: PlanAnswer;

  it("plans with the defaults: level 0.9, up to 500 pointings, now to the end of the site's coming night", async () => {
    const res = await post(callers.shifter, { instrumentId: west.instrument.id, avoid: "none" });
    expect(res.status).toBe(201);
    first = res.json as unknown as PlanAnswer;
    expect(first).toMatchObject({ candidateId: withMap, instrumentId: west.instrument.id, level: 0.9, maxPointings: 500, footprint: wide, filter: "g", exposureS: 300, avoidedProbability: 0 });
    expect(first.window.start).toBe(NOW.toISOString());
    // The window ends when the Sun climbs back through −18° at the site (its coming night's end).
    const end = new Date(first.window.end);
    const siteAt = { latDeg: -30, lonDeg: -70, elevationM: 2000 };
    expect(end.getTime() - NOW.getTime()).toBeGreaterThan(12 * 3_600_000);
    expect(end.getTime() - NOW.getTime()).toBeLessThan(24 * 3_600_000);
    expect(sunAltitudeDeg(siteAt, new Date(end.getTime() - 120_000))).toBeLessThan(-18);
    expect(sunAltitudeDeg(siteAt, new Date(end.getTime() + 120_000))).toBeGreaterThan(-18);
  });

  it("numbers the pointings, counts each pixel once and stops on reaching the level", () => {
    const ps = first.pointings;
    expect(ps.map((p) => p.index)).toEqual(ps.map((_, i) => i + 1));
    let running = 0;
    for (const p of ps) {
      expect(p.gainedProbability).toBeLessThanOrEqual(p.probability + 1e-12);
      running += p.gainedProbability;
      expect(p.cumulativeProbability).toBeCloseTo(running, 12);
    }
    // totalProbability is the union of all footprints, recomputed here from the map's pixels
    expect(first.totalProbability).toBeCloseTo(unionOf(ps.map((p) => ({ ...p, footprint: wide }))), 12);
    expect(first.totalProbability).toBeCloseTo(running, 12);
    expect(first.totalProbability).toBeGreaterThanOrEqual(0.9);
    expect(unionOf(ps.slice(0, -1).map((p) => ({ ...p, footprint: wide })))).toBeLessThan(0.9);
  });

  it("schedules inside the window, one after another with exposure and overhead, and the scheduled union adds up", () => {
    const scheduled = first.pointings.filter((p) => p.plannedStart);
    expect(scheduled.length).toBeGreaterThan(0);
    const spans = scheduled.map((p) => ({ start: Date.parse(p.plannedStart ?? ""), end: Date.parse(p.plannedEnd ?? "") })).sort((a, b) => a.start - b.start);
    for (const [k, s] of spans.entries()) {
      expect(s.end - s.start).toBe(300_000);
      expect(s.start).toBeGreaterThanOrEqual(Date.parse(first.window.start));
      expect(s.end).toBeLessThanOrEqual(Date.parse(first.window.end));
      if (k > 0) expect(s.start - (spans[k - 1]?.end ?? 0)).toBeGreaterThanOrEqual(60_000);
    }
    for (const p of first.pointings) expect(p.plannedStart === null).toBe(p.unscheduledReason !== null);
    expect(first.scheduledProbability).toBeCloseTo(unionOf(scheduled.map((p) => ({ ...p, footprint: wide }))), 12);
  });

  it("writes one audit event and answers the same plan to GET, and lists it for the candidate", async () => {
    const db = await getDb();
    const logged = (await db.select().from(events).where(eq(events.kind, eventKinds.planCreated))).filter((e) => (e.data as { planId?: string }).planId === first.id);
    expect(logged).toHaveLength(1);
    expect(logged[0]).toMatchObject({ candidateId: withMap, actorId: callers.shifter.user.id });
    const got = await call(planRoute.GET, { caller: callers.observer, params: { id: first.id } });
    expect(got.status).toBe(200);
    expect(got.json).toEqual(first);
    const listed = await call(candidatePlansRoute.GET, { caller: callers.admin, params: { id: withMap } });
    expect((listed.json.plans as PlanAnswer[]).map((p) => p.id)).toContain(first.id);
  });

  it("avoid planned-and-observed: a second site's plan does not count the sky the first plan takes", async () => {
    const res = await post(callers.coordinator, { instrumentId: east.instrument.id, maxPointings: 8 });
    expect(res.status).toBe(201);
    const second = res.json as unknown as PlanAnswer;
    expect(second.avoid).toBe("planned-and-observed");
    const firstTiles = first.pointings.map((p) => ({ ...p, footprint: wide }));
    const secondTiles = second.pointings.map((p) => ({ ...p, footprint: wide }));
    expect(second.avoidedProbability).toBeCloseTo(unionOf(firstTiles), 12);
    // what the second plan gains is exactly what the union of both plans holds beyond the first's
    const gained = second.pointings.at(-1)?.cumulativeProbability ?? 0;
    expect(unionOf([...firstTiles, ...secondTiles])).toBeCloseTo(unionOf(firstTiles) + gained, 12);
  });

  it("avoid none and observed (nothing observed yet) plan the sky afresh", async () => {
    const none = (await post(callers.shifter, { instrumentId: east.instrument.id, maxPointings: 3, avoid: "none" })).json as unknown as PlanAnswer;
    const observed = (await post(callers.shifter, { instrumentId: east.instrument.id, maxPointings: 3, avoid: "observed" })).json as unknown as PlanAnswer;
    for (const p of [none, observed]) {
      expect(p.avoidedProbability).toBe(0);
      expect(p.pointings.map((q) => [q.raDeg, q.decDeg])).toEqual(first.pointings.slice(0, 3).map((q) => [q.raDeg, q.decDeg]));
    }
  });

  it("replays a past night and plans a night weeks ahead (any date, at most 48 h long)", async () => {
    for (const [start, end] of [["2030-03-01T22:00:00Z", "2030-03-02T11:00:00Z"], ["2030-05-02T22:00:00Z", "2030-05-03T11:00:00Z"]] as const) {
      const res = await post(callers.shifter, { instrumentId: west.instrument.id, maxPointings: 4, avoid: "none", start, end, exposureS: 120, filter: "r" });
      expect(res.status).toBe(201);
      const plan = res.json as unknown as PlanAnswer;
      expect(plan.window).toEqual({ start: new Date(start).toISOString(), end: new Date(end).toISOString() });
      expect(plan).toMatchObject({ exposureS: 120, filter: "r" });
      for (const p of plan.pointings.filter((q) => q.plannedStart)) {
        expect(Date.parse(p.plannedStart ?? "")).toBeGreaterThanOrEqual(Date.parse(start));
        expect(Date.parse(p.plannedEnd ?? "")).toBeLessThanOrEqual(Date.parse(end));
      }
    }
  });
});

describe("refusals store nothing", () => {
  const base = () => ({ instrumentId: west.instrument.id, maxPointings: 2 });

  it.each([
    ["level below 0.5", { level: 0.4 }, "level"],
    ["level above 0.99", { level: 0.995 }, "level"],
    ["no pointings", { maxPointings: 0 }, "maxPointings"],
    ["over 500 pointings", { maxPointings: 501 }, "maxPointings"],
    ["fractional pointings", { maxPointings: 2.5 }, "maxPointings"],
    ["end before start", { start: "2030-03-21T02:00:00Z", end: "2030-03-21T01:00:00Z" }, "end"],
    ["a window over 48 h", { start: "2030-03-21T00:00:00Z", end: "2030-03-23T00:00:01Z" }, "end"],
    ["an end before now (start defaults to now)", { end: "2030-03-20T11:00:00Z" }, "end"],
    ["a start without its zone", { start: "2030-03-21T00:00:00" }, "start"],
    ["an unknown avoid mode", { avoid: "everything" }, "avoid"],
    ["a filter the instrument lacks", { filter: "z" }, "filter"],
    ["a zero exposure", { exposureS: 0 }, "exposureS"],
    ["an unknown field", { colour: "red" }, "(body)"],
  ])("422 for %s, naming %s", async (_what, extra, field) => {
    const before = await planRowCounts();
    const res = await post(callers.shifter, { ...base(), ...extra });
    expect(res.status).toBe(422);
    expect((res.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain(field);
    expect(await planRowCounts()).toEqual(before);
  });

  it("422 when the instrument is missing from the body", async () => {
    const res = await post(callers.shifter, { level: 0.9 });
    expect(res.status).toBe(422);
    expect((res.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain("instrumentId");
  });

  it("404 for an unknown candidate or instrument, 409 for a candidate without a sky map", async () => {
    const before = await planRowCounts();
    expect((await post(callers.shifter, base(), "no-such-candidate")).status).toBe(404);
    const noInstrument = await post(callers.shifter, { instrumentId: "no-such-instrument" });
    expect(noInstrument.status).toBe(404);
    expect(noInstrument.json.error).toMatch(/instrument/);
    const noMap = await post(callers.shifter, base(), withoutMap);
    expect(noMap.status).toBe(409);
    expect(noMap.json.error).toMatch(/no sky map/);
    expect(await planRowCounts()).toEqual(before);
    expect((await call(planRoute.GET, { caller: callers.shifter, params: { id: "no-such-plan" } })).status).toBe(404);
    expect((await call(candidatePlansRoute.GET, { caller: callers.shifter, params: { id: "no-such-candidate" } })).status).toBe(404);
  });
});

describe("roles", () => {
  const body = () => ({ instrumentId: west.instrument.id, maxPointings: 1, avoid: "none" });

  it("an observer plans for the instruments of a site they observe at, not for another site's (403)", async () => {
    expect((await post(callers.observer, body())).status).toBe(201);
    const before = await planRowCounts();
    const other = await post(callers.observer, { ...body(), instrumentId: east.instrument.id });
    expect(other.status).toBe(403);
    expect((await post(callers.outsider, body())).status).toBe(403);
    expect(await planRowCounts()).toEqual(before);
  });

  it("shifters and coordinators plan for any site; an administrator may only read; nobody unsigned", async () => {
    expect((await post(callers.coordinator, { ...body(), instrumentId: east.instrument.id })).status).toBe(201);
    expect((await post(callers.shifter, { ...body(), instrumentId: east.instrument.id })).status).toBe(201);
    expect((await post(callers.admin, body())).status).toBe(403);
    expect((await post(undefined, body())).status).toBe(401);
    for (const role of ["shifter", "observer", "coordinator", "admin"] as const) {
      expect((await call(candidatePlansRoute.GET, { caller: callers[role], params: { id: withMap } })).status).toBe(200);
    }
    expect((await call(candidatePlansRoute.GET, { params: { id: withMap } })).status).toBe(401);
  });
});
