import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import * as coverageRoute from "@/app/api/v1/candidates/[id]/coverage/route";
import * as candidateObservations from "@/app/api/v1/candidates/[id]/observations/route";
import * as taskObservations from "@/app/api/v1/tasks/[id]/observations/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { coverageReference, insertSite, insertTask } from "./helpers";

const MERGER = new Date(Date.UTC(2030, 2, 20, 0, 0, 0));
const NOW_MS = Date.UTC(2030, 2, 20, 6, 0, 0);
const record = taskObservations.POST.with({ now: () => NOW_MS });

let env: SkymapTestEnv;
const who = {} as Record<"shifter" | "observer" | "coordinator" | "admin", Caller>;
let candidateId: string;
let siteA: string;
let siteB: string;
let taskA: string;
let taskB: string;

interface CoverageBody {
  skymapId: string;
  coveredProbability: number;
  coveredAreaDeg2: number;
  observations: number;
  curve: Array<{ time: string; secondsSinceMerger: number; coveredProbability: number }>;
  bySite: Array<{ siteId: string | null; coveredProbability: number; firstObservationAt: string }>;
}

async function coverage(caller: Caller = who.shifter, id = candidateId) {
  const res = await call(coverageRoute.GET, { caller, params: { id } });
  return { status: res.status, body: res.json as unknown as CoverageBody & { error?: string } };
}

async function upload(file: string, minutesAfterMerger: number) {
  return uploadSkymap({ target: { candidateId }, fileName: file, bytes: fixtureBytes(file), actorId: who.shifter.user.id, via: "ui", now: new Date(MERGER.getTime() + minutesAfterMerger * 60_000) });
}

// Log 1 of the healpy reference (a wide tile, a disc, two tiles either side of RA 0), with hand-made times whose
// end order (start + exposure) differs from their start order and from the row order.
const log = coverageReference.logs[1] ?? [];
const times = [
  { startTime: "2030-03-20T02:00:00Z", exposureS: 600 }, // ends 02:10:00 → 7800 s
  { startTime: "2030-03-20T01:00:00Z", exposureS: 60 }, // ends 01:01:00 → 3660 s
  { startTime: "2030-03-20T01:30:00Z", exposureS: 1800 }, // ends 02:00:00 → 7200 s
  { startTime: "2030-03-20T01:05:00Z", exposureS: 100 }, // ends 01:06:40 → 4000 s
];

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) who[role] = await createCaller(role);
  candidateId = (await insertCandidate({ receivedAt: MERGER })).id;
  siteA = (await insertSite([{ shape: "circle", radiusDeg: 1 }])).id;
  siteB = (await insertSite([{ shape: "circle", radiusDeg: 1 }])).id;
  taskA = await insertTask(candidateId, { siteId: siteA });
  taskB = await insertTask(candidateId, { siteId: siteB });
});
afterAll(() => env.cleanup());

describe("GET /api/v1/candidates/{id}/coverage", () => {
  it("404 for an unknown candidate, 409 before the candidate has a sky map", async () => {
    expect((await coverage(who.shifter, "no-such-candidate")).status).toBe(404);
    const none = await coverage();
    expect(none.status).toBe(409);
    expect(none.body.error).toContain("sky map");
  });

  it("answers the union (healpy, overlaps once), one rising curve point per exposure at its end, and per-site unions", async () => {
    const map = await upload("bimodal-ring-n128.fits.gz", 5);
    const rows = log.map((o, k) => ({ raDeg: o.raDeg, decDeg: o.decDeg, footprint: o.footprint, filter: "g", ...times[k] }));
    expect((await call(record, { caller: who.coordinator, params: { id: taskA }, json: { observations: rows.slice(0, 2) } })).status).toBe(201);
    expect((await call(record, { caller: who.coordinator, params: { id: taskB }, json: { observations: rows.slice(2) } })).status).toBe(201);

    const { status, body } = await coverage();
    expect(status).toBe(200);
    expect(Object.keys(body).sort()).toEqual(["bySite", "coveredAreaDeg2", "coveredProbability", "curve", "observations", "skymapId"]);
    const healpy = coverageReference.maps.ring128?.unions[1];
    expect(body.skymapId).toBe(map.id);
    expect(body.observations).toBe(4);
    expect(body.coveredProbability).toBeCloseTo(healpy?.coveredProbability ?? NaN, 10);
    expect(body.coveredAreaDeg2).toBeCloseTo(healpy?.coveredAreaDeg2 ?? NaN, 6);
    expect(body.curve.map((p) => p.time)).toEqual(["2030-03-20T01:01:00.000Z", "2030-03-20T01:06:40.000Z", "2030-03-20T02:00:00.000Z", "2030-03-20T02:10:00.000Z"]);
    expect(body.curve.map((p) => p.secondsSinceMerger)).toEqual([3660, 4000, 7200, 7800]);
    for (let k = 1; k < body.curve.length; k++) expect(body.curve[k]?.coveredProbability).toBeGreaterThanOrEqual(body.curve[k - 1]?.coveredProbability ?? 0);
    expect(body.curve.at(-1)?.coveredProbability).toBe(body.coveredProbability);

    // Site A logged rows 0 and 1 (first start 01:00), site B rows 2 and 3 (first start 01:05).
    expect(body.bySite.map((s) => [s.siteId, s.firstObservationAt])).toEqual([
      [siteA, "2030-03-20T01:00:00.000Z"],
      [siteB, "2030-03-20T01:05:00.000Z"],
    ]);
    const [a, b] = body.bySite;
    expect(a && b && a.coveredProbability + b.coveredProbability).toBeGreaterThanOrEqual(body.coveredProbability - 1e-12);
    for (const s of body.bySite) expect(s.coveredProbability).toBeLessThanOrEqual(body.coveredProbability);
  });

  it.each([
    ["nested64", "bimodal-nested-n64.fits.gz"],
    ["multiorder", "bimodal-multiorder.fits.gz"],
  ])("a newer sky map (%s) recomputes the same log on it (healpy)", async (key, file) => {
    const map = await upload(file, key === "nested64" ? 30 : 60);
    const { body } = await coverage();
    expect(body.skymapId).toBe(map.id);
    expect(body.observations).toBe(4);
    expect(body.coveredProbability).toBeCloseTo(coverageReference.maps[key]?.unions[1]?.coveredProbability ?? NaN, 10);
  });

  it("a later exposure extends the curve; re-imaging the same field adds a point but no probability", async () => {
    const before = (await coverage()).body;
    const again = { ...log[3], filter: "r", startTime: "2030-03-20T03:00:00Z", exposureS: 60 };
    expect((await call(record, { caller: who.shifter, params: { id: taskB }, json: { observations: [again] } })).status).toBe(201);
    const after = (await coverage()).body;
    expect(after.observations).toBe(5);
    expect(after.curve).toHaveLength(5);
    expect(after.curve.at(-1)?.secondsSinceMerger).toBe(3 * 3600 + 60);
    expect(after.coveredProbability).toBe(before.coveredProbability);
  });

  it("every signed-in role reads coverage; no credentials → 401", async () => {
    for (const role of ["shifter", "observer", "coordinator", "admin"] as const) expect((await coverage(who[role])).status).toBe(200);
    expect((await call(coverageRoute.GET, { params: { id: candidateId } })).status).toBe(401);
  });
});

describe("GET /api/v1/candidates/{id}/observations", () => {
  it("lists every logged exposure with its resolved footprint for any signed-in role; 404 for an unknown candidate", async () => {
    const res = await call(candidateObservations.GET, { caller: who.admin, params: { id: candidateId } });
    expect(res.status).toBe(200);
    const rows = res.json.observations as Array<{ raDeg: number; footprint: unknown; siteId: string | null; startTime: string }>;
    expect(rows.length).toBeGreaterThanOrEqual(4);
    expect(rows.map((r) => r.startTime)).toEqual([...rows.map((r) => r.startTime)].sort());
    expect(rows.find((r) => r.raDeg === log[0]?.raDeg)?.footprint).toEqual(log[0]?.footprint);
    expect((await call(candidateObservations.GET, { caller: who.shifter, params: { id: "nope" } })).status).toBe(404);
    expect((await call(candidateObservations.GET, { params: { id: candidateId } })).status).toBe(401);
  });
});
