import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, sites } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import * as instrumentRoute from "@/app/api/v1/instruments/[id]/route";
import * as siteInstrumentsRoute from "@/app/api/v1/sites/[id]/instruments/route";
import { call, createCaller, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let siteId: string;
const callers = {} as Record<"shifter" | "observer" | "coordinator", Caller>;

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator"] as const) callers[role] = await createCaller(role);
  const db = await getDb();
  const [site] = await db
    .insert(sites)
    .values({ code: "INS", name: "Instrument Test Knoll (fictional)", latitudeDeg: -25, longitudeDeg: 20, elevationM: 1500, fieldOfViewDeg2: 4 })
    .returning();
  siteId = site!.id;
});
afterAll(() => env.cleanup());

const camera = { name: "Wide camera", footprint: { shape: "rectangle", widthDeg: 2, heightDeg: 1.5 }, filters: ["g", "r"], exposureS: 90, overheadS: 20, limitingMag: 20.5 };

async function create(body: Record<string, unknown> = camera) {
  return call(siteInstrumentsRoute.POST, { caller: callers.coordinator, params: { id: siteId }, json: body });
}

describe("instruments API", () => {
  it("a coordinator creates, edits and deletes an instrument, each with an audit event", async () => {
    const made = await create();
    expect(made.status).toBe(201);
    const inst = made.json.instrument as { id: string; siteId: string; areaDeg2: number; filters: string[] };
    expect(inst.siteId).toBe(siteId);
    expect(inst.filters).toEqual(["g", "r"]);
    // Gnomonic rectangle 2°×1.5°: solid angle 4·asin(sin 1°·sin 0.75°) = 2.99976 deg² (python math), a shade under w·h.
    expect(inst.areaDeg2).toBeCloseTo(2.99976, 3);
    expect(inst.areaDeg2).toBeLessThan(3);

    const patched = await call(instrumentRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id: inst.id }, json: { footprint: { shape: "circle", radiusDeg: 1 }, limitingMag: null } });
    expect(patched.status).toBe(200);
    expect(patched.json.instrument).toMatchObject({ name: "Wide camera", footprint: { shape: "circle", radiusDeg: 1 }, limitingMag: null, exposureS: 90 });

    const listed = await call(siteInstrumentsRoute.GET, { caller: callers.shifter, params: { id: siteId } });
    expect((listed.json.instruments as Array<{ id: string }>).map((i) => i.id)).toContain(inst.id);

    expect((await call(instrumentRoute.DELETE, { caller: callers.coordinator, method: "DELETE", params: { id: inst.id } })).status).toBe(200);
    expect((await call(instrumentRoute.GET, { caller: callers.shifter, params: { id: inst.id } })).status).toBe(404);
    const db = await getDb();
    const audit = (await db.select().from(events)).filter((e) => e.kind === eventKinds.instrumentChanged && (e.data as { instrumentId?: string }).instrumentId === inst.id);
    expect(audit.map((e) => (e.data as { action: string }).action)).toEqual(["created", "updated", "deleted"]);
  });

  it.each(["shifter", "observer"] as const)("%s may read but not create, edit or delete (403)", async (role) => {
    const made = await create();
    const id = (made.json.instrument as { id: string }).id;
    expect((await call(siteInstrumentsRoute.GET, { caller: callers[role], params: { id: siteId } })).status).toBe(200);
    expect((await call(siteInstrumentsRoute.POST, { caller: callers[role], params: { id: siteId }, json: camera })).status).toBe(403);
    expect((await call(instrumentRoute.PATCH, { caller: callers[role], method: "PATCH", params: { id }, json: { name: "x" } })).status).toBe(403);
    expect((await call(instrumentRoute.DELETE, { caller: callers[role], method: "DELETE", params: { id } })).status).toBe(403);
  });

  it("answers 404 for an unknown site or instrument", async () => {
    expect((await call(siteInstrumentsRoute.GET, { caller: callers.shifter, params: { id: "no-such-site" } })).status).toBe(404);
    expect((await call(siteInstrumentsRoute.POST, { caller: callers.coordinator, params: { id: "no-such-site" }, json: camera })).status).toBe(404);
    expect((await call(instrumentRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id: "nope" }, json: { name: "x" } })).status).toBe(404);
    expect((await call(instrumentRoute.DELETE, { caller: callers.coordinator, method: "DELETE", params: { id: "nope" } })).status).toBe(404);
  });

  it.each([
    [{ ...camera, name: "" }, "name"],
    [{ ...camera, footprint: { shape: "rectangle", widthDeg: 0, heightDeg: 1 } }, "footprint.widthDeg"],
    [{ ...camera, footprint: { shape: "rectangle", widthDeg: 1, heightDeg: 95 } }, "footprint.heightDeg"],
    [{ ...camera, footprint: { shape: "circle", radiusDeg: -1 } }, "footprint.radiusDeg"],
    [{ ...camera, footprint: { shape: "hexagon" } }, "footprint.shape"],
    [{ ...camera, exposureS: 0 }, "exposureS"],
    [{ ...camera, exposureS: 1.5 }, "exposureS"],
    [{ ...camera, overheadS: -1 }, "overheadS"],
    [{ ...camera, filters: [""] }, "filters.0"],
    [{ ...camera, limitingMag: 99 }, "limitingMag"],
  ])("refuses %j with 422 naming %s, storing nothing", async (body, field) => {
    const before = await call(siteInstrumentsRoute.GET, { caller: callers.shifter, params: { id: siteId } });
    const res = await create(body);
    expect(res.status).toBe(422);
    expect((res.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain(field);
    const after = await call(siteInstrumentsRoute.GET, { caller: callers.shifter, params: { id: siteId } });
    expect(after.json.instruments).toEqual(before.json.instruments);
  });

  it("refuses an empty patch with 422", async () => {
    const id = ((await create()).json.instrument as { id: string }).id;
    const res = await call(instrumentRoute.PATCH, { caller: callers.coordinator, method: "PATCH", params: { id }, json: {} });
    expect(res.status).toBe(422);
  });
});
