import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, siteObservers } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import * as siteRoute from "@/app/api/v1/sites/[id]/route";
import * as sitesRoute from "@/app/api/v1/sites/route";
import * as siteInstrumentsRoute from "@/app/api/v1/sites/[id]/instruments/route";
import { siteMoonDistanceDeg } from "@/lib/data/sites";
import { call, createCaller, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
const callers = {} as Record<"shifter" | "observer" | "coordinator" | "admin", Caller>;

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) callers[role] = await createCaller(role);
});
afterAll(() => env.cleanup());

let codeCounter = 0;
function siteBody(overrides: Record<string, unknown> = {}) {
  codeCounter += 1;
  return {
    code: `t${codeCounter}`,
    name: "Fictional Hill Station",
    latitudeDeg: "-29.5",
    longitudeDeg: "-70.7",
    elevationM: "2200",
    limitKind: "altitude",
    minAltitudeDeg: "25",
    maxAirmass: "",
    fieldOfViewDeg2: "3.5",
    timeZone: "America/Santiago",
    observerIds: [callers.observer.user.id],
    ...overrides,
  };
}

describe("sites: who may change them", () => {
  it.each(["shifter", "observer"] as const)("%s may read but not create, edit or delete (403)", async (role) => {
    expect((await call(sitesRoute.GET, { caller: callers[role] })).status).toBe(200);
    expect((await call(sitesRoute.POST, { caller: callers[role], json: siteBody() })).status).toBe(403);
    const made = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody() });
    const id = (made.json.site as { id: string }).id;
    expect((await call(siteRoute.PUT, { caller: callers[role], method: "PUT", params: { id }, json: siteBody() })).status).toBe(403);
    expect((await call(siteRoute.DELETE, { caller: callers[role], method: "DELETE", params: { id } })).status).toBe(403);
  });

  it.each(["coordinator", "admin"] as const)("%s creates, edits and deletes, each with an audit event", async (role) => {
    const caller = callers[role];
    const created = await call(sitesRoute.POST, { caller, json: siteBody({ code: `ed-${role.slice(0, 4)}` }) });
    expect(created.status).toBe(201);
    const site = created.json.site as { id: string; code: string; minAltitudeDeg: number; observers: Array<{ id: string }> };
    expect(site.code).toBe(`ED-${role.slice(0, 4).toUpperCase()}`);
    expect(site.minAltitudeDeg).toBe(25);
    expect(site.observers.map((o) => o.id)).toEqual([callers.observer.user.id]);

    const edited = await call(siteRoute.PUT, {
      caller,
      method: "PUT",
      params: { id: site.id },
      json: siteBody({ code: `ed-${role.slice(0, 4)}`, name: "Renamed Station", observerIds: [] }),
    });
    expect(edited.status).toBe(200);
    expect(edited.json.site).toMatchObject({ name: "Renamed Station", observers: [] });
    const db = await getDb();
    expect(await db.select().from(siteObservers).where(eq(siteObservers.siteId, site.id))).toHaveLength(0);

    const removed = await call(siteRoute.DELETE, { caller, method: "DELETE", params: { id: site.id } });
    expect(removed.status).toBe(200);
    expect((await call(siteRoute.GET, { caller, params: { id: site.id } })).status).toBe(404);
    const audit = (await db.select().from(events).where(eq(events.kind, eventKinds.siteChanged))).filter(
      (e) => (e.data as { siteId?: string }).siteId === site.id,
    );
    expect(audit.map((e) => (e.data as { action: string }).action)).toEqual(["created", "updated", "deleted"]);
    expect(audit.every((e) => e.actorId === caller.user.id)).toBe(true);
  });
});

describe("sites: validation", () => {
  it.each([
    [{ latitudeDeg: "95" }, "latitudeDeg"],
    [{ longitudeDeg: "-190" }, "longitudeDeg"],
    [{ elevationM: "abc" }, "elevationM"],
    [{ minAltitudeDeg: "" }, "minAltitudeDeg"],
    [{ minAltitudeDeg: "95" }, "minAltitudeDeg"],
    [{ limitKind: "airmass", maxAirmass: "" }, "maxAirmass"],
    [{ limitKind: "airmass", maxAirmass: "0.5" }, "maxAirmass"],
    [{ fieldOfViewDeg2: "0" }, "fieldOfViewDeg2"],
    [{ timeZone: "Mars/Olympus" }, "timeZone"],
    [{ moonDistanceDeg: "-1" }, "moonDistanceDeg"],
    [{ moonDistanceDeg: "180.5" }, "moonDistanceDeg"],
    [{ moonDistanceDeg: "far" }, "moonDistanceDeg"],
    [{ code: "no spaces!" }, "code"],
    [{ name: "" }, "name"],
  ])("refuses %j with 422 naming %s", async (override, field) => {
    const res = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody(override) });
    expect(res.status).toBe(422);
    expect((res.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain(field);
  });

  it("gives a new site one square instrument of the field it was given", async () => {
    const res = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ fieldOfViewDeg2: "6.25" }) });
    const id = (res.json.site as { id: string }).id;
    const listed = await call(siteInstrumentsRoute.GET, { caller: callers.shifter, params: { id } });
    expect(listed.json.instruments).toMatchObject([{ name: "Main camera", footprint: { shape: "rectangle", widthDeg: 2.5, heightDeg: 2.5 } }]);
  });

  it("turns a highest airmass into the lowest altitude (plane-parallel sec z: airmass 2 is 30°)", async () => {
    const res = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ limitKind: "airmass", maxAirmass: "2", minAltitudeDeg: "" }) });
    expect(res.status).toBe(201);
    expect((res.json.site as { minAltitudeDeg: number }).minAltitudeDeg).toBeCloseTo(30, 2);
  });

  it("keeps a site's least Moon distance (20° when not given, 0° and 180° allowed), audits a change with before and after, and lets storage read it", async () => {
    const made = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ code: "MOON" }) });
    expect(made.status).toBe(201);
    const site = made.json.site as { id: string; moonDistanceDeg: number };
    expect(site.moonDistanceDeg).toBe(20);
    expect(await siteMoonDistanceDeg(site.id)).toBe(20);
    for (const [typed, stored] of [["35.5", 35.5], ["0", 0], ["180", 180], ["", 20]] as const) {
      const res = await call(siteRoute.PUT, { caller: callers.coordinator, method: "PUT", params: { id: site.id }, json: siteBody({ code: "MOON", moonDistanceDeg: typed }) });
      expect(res.status).toBe(200);
      expect((res.json.site as { moonDistanceDeg: number }).moonDistanceDeg).toBe(stored);
    }
    expect(await siteMoonDistanceDeg(site.id)).toBe(20);
    expect(await siteMoonDistanceDeg("no-such-site")).toBeNull();
    const db = await getDb();
    const updates = (await db.select().from(events).where(eq(events.kind, eventKinds.siteChanged)))
      .map((e) => e.data as { siteId?: string; action: string; changed?: string[]; before?: Record<string, unknown>; after?: Record<string, unknown> })
      .filter((d) => d.siteId === site.id && d.action === "updated");
    // Each save names what it changed: the first save changes the distance alone, 20° → 35.5°.
    expect(updates.map((d) => d.after?.moonDistanceDeg)).toEqual([35.5, 0, 180, 20]);
    expect(updates[0]).toMatchObject({ changed: ["moonDistanceDeg"], before: { moonDistanceDeg: 20 }, after: { moonDistanceDeg: 35.5 } });
  });

  it("refuses a code in use (409) and an unknown observer (422)", async () => {
    const first = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ code: "DUP" }) });
    expect(first.status).toBe(201);
    const again = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ code: "dup" }) });
    expect(again.status).toBe(409);
    const unknown = await call(sitesRoute.POST, { caller: callers.coordinator, json: siteBody({ observerIds: ["nobody"] }) });
    expect(unknown.status).toBe(422);
    expect(unknown.json.error).toMatch(/unknown observer/);
  });

  it("lists sites by code with their observers and the people who may be chosen", async () => {
    const res = await call(sitesRoute.GET, { caller: callers.shifter });
    const sites = res.json.sites as Array<{ code: string }>;
    expect(sites.map((s) => s.code)).toEqual([...sites.map((s) => s.code)].sort());
    const options = res.json.observerOptions as Array<{ id: string }>;
    expect(options.map((o) => o.id)).toContain(callers.observer.user.id);
    expect(options.map((o) => o.id)).not.toContain(callers.shifter.user.id);
  });
});
