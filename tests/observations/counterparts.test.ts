import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import { uploadSkymap } from "@/lib/data/skymaps";
import * as counterpartsRoute from "@/app/api/v1/candidates/[id]/counterparts/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { coverageReference, observationCounts } from "./helpers";

const NOW_MS = Date.UTC(2030, 2, 20, 6, 0, 0);
const POST = counterpartsRoute.POST.with({ now: () => NOW_MS });

let env: SkymapTestEnv;
const who = {} as Record<"shifter" | "observer" | "coordinator" | "admin", Caller>;
let candidateId: string;
let mapless: string;

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) who[role] = await createCaller(role);
  candidateId = (await insertCandidate()).id;
  mapless = (await insertCandidate()).id;
  const file = "bimodal-ring-n128.fits.gz";
  await uploadSkymap({ target: { candidateId }, fileName: file, bytes: fixtureBytes(file), actorId: null, via: "ui", now: new Date(NOW_MS - 3_600_000) });
});
afterAll(() => env.cleanup());

interface Answer {
  id: string;
  name: string | null;
  observedAt: string;
  skymapId: string | null;
  searchedProbability: number | null;
  searchedAreaDeg2: number | null;
  probabilityDensityPerDeg2: number | null;
  warning: string | null;
  notes: string;
}

const position = (i: number) => coverageReference.positions[i] ?? { raDeg: NaN, decDeg: NaN };
const report = (extra: Record<string, unknown> = {}) => ({ ...position(1), observedAt: "2030-03-20T04:10:00Z", magnitude: 19.8, magnitudeError: 0.1, filter: "r", name: "cand-fict-1", notes: "rising, blue", ...extra });

function post(caller: Caller | undefined, body: unknown, id = candidateId) {
  return call(POST, { caller, params: { id }, json: body });
}

describe("POST /api/v1/candidates/{id}/counterparts", () => {
  it.each([1, 10, 9])("position %i: 201 with the stored row and its searched region on the map (healpy), no warning inside 99.9 %", async (i) => {
    const res = await post(who.observer, report({ ...position(i), name: `inside-${i}` }));
    expect(res.status).toBe(201);
    const body = res.json as unknown as Answer;
    const healpy = coverageReference.maps.ring128?.searched[i];
    expect(body).toMatchObject({ name: `inside-${i}`, notes: "rising, blue", observedAt: "2030-03-20T04:10:00.000Z", warning: null });
    expect(body.searchedProbability).toBeCloseTo(healpy?.searchedProbability ?? NaN, 10);
    expect(body.searchedAreaDeg2).toBeCloseTo(healpy?.searchedAreaDeg2 ?? NaN, 6);
    expect((body.probabilityDensityPerDeg2 ?? 0) / (healpy?.probabilityDensityPerDeg2 ?? 1)).toBeCloseTo(1, 10);
  });

  it.each([3, 12])("position %i lies outside the 99.9 %% region: kept, with a warning", async (i) => {
    const before = await observationCounts();
    const res = await post(who.shifter, report({ ...position(i), name: `outside-${i}` }));
    expect(res.status).toBe(201);
    expect(res.json.warning).toContain("99.9 %");
    expect(res.json.searchedProbability).toBeGreaterThan(0.999);
    expect((await observationCounts()).counterparts).toBe(before.counterparts + 1);
  });

  it("a candidate without a sky map keeps the counterpart with null numbers and says why", async () => {
    const res = await post(who.coordinator, report(), mapless);
    expect(res.status).toBe(201);
    expect(res.json).toMatchObject({ skymapId: null, searchedProbability: null, searchedAreaDeg2: null });
    expect(res.json.warning).toContain("no sky map");
  });

  it("every report is in the audit log with who and where", async () => {
    const res = await post(who.observer, report({ name: "audited" }));
    const db = await getDb();
    const logged = (await db.select().from(events).where(eq(events.kind, eventKinds.counterpartReported))).find((e) => (e.data as { counterpartId?: string }).counterpartId === res.json.id);
    expect(logged).toMatchObject({ candidateId, actorId: who.observer.user.id, data: { name: "audited", raDeg: position(1).raDeg } });
  });

  it.each([
    [{ raDeg: 360 }, "raDeg"],
    [{ decDeg: -91 }, "decDeg"],
    [{ observedAt: "2030-03-20T04:10:00" }, "observedAt"],
    [{ observedAt: "2030-03-20T07:00:01Z" }, "observedAt"],
    [{ notes: undefined }, "notes"],
    [{ magnitudeError: 0 }, "magnitudeError"],
    [{ magnitude: undefined }, "magnitudeError"],
    [{ name: "x".repeat(81) }, "name"],
    [{ colour: "blue" }, "colour"],
  ])("%o → 422 naming %s, nothing stored", async (change, field) => {
    const before = await observationCounts();
    const res = await post(who.coordinator, report(change));
    expect(res.status).toBe(422);
    expect(res.json.error).toContain(field);
    expect(await observationCounts()).toEqual(before);
  });

  it("404 for an unknown candidate; administrators 403; no credentials 401; nothing stored", async () => {
    const before = await observationCounts();
    expect((await post(who.coordinator, report(), "no-such-candidate")).status).toBe(404);
    expect((await post(who.admin, report())).status).toBe(403);
    expect((await post(undefined, report())).status).toBe(401);
    expect(await observationCounts()).toEqual(before);
  });
});

describe("GET /api/v1/candidates/{id}/counterparts", () => {
  it("lists them first observed first, each ranked on the newest map; a new map re-ranks them (healpy)", async () => {
    await post(who.shifter, report({ ...position(2), name: "early", observedAt: "2030-03-20T01:00:00Z" }));
    const first = await call(counterpartsRoute.GET, { caller: who.admin, params: { id: candidateId } });
    expect(first.status).toBe(200);
    const listed = first.json.counterparts as Answer[];
    expect(listed[0]?.name).toBe("early");
    expect(listed.map((c) => c.observedAt)).toEqual([...listed.map((c) => c.observedAt)].sort());

    const file = "bimodal-nested-n64.fits.gz";
    const newer = await uploadSkymap({ target: { candidateId }, fileName: file, bytes: fixtureBytes(file), actorId: null, via: "ui", now: new Date(NOW_MS) });
    const again = await call(counterpartsRoute.GET, { caller: who.observer, params: { id: candidateId } });
    expect(again.json.skymapId).toBe(newer.id);
    const early = (again.json.counterparts as Answer[]).find((c) => c.name === "early");
    expect(early?.skymapId).toBe(newer.id);
    expect(early?.searchedProbability).toBeCloseTo(coverageReference.maps.nested64?.searched[2]?.searchedProbability ?? NaN, 10);
  });

  it("404 for an unknown candidate", async () => {
    expect((await call(counterpartsRoute.GET, { caller: who.shifter, params: { id: "nope" } })).status).toBe(404);
  });
});
