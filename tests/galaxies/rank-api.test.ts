import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { catalogues, galaxies, galaxyCells, sites } from "@/db/schema";
import { count, eq } from "drizzle-orm";
import { galaxyCell } from "@/lib/galaxies/cell";
import { astronomicalNights, targetAltitudeDeg } from "@/lib/astro";
import { uploadSkymap } from "@/lib/data/skymaps";
import * as cataloguesRoute from "@/app/api/v1/catalogues/route";
import * as galaxiesRoute from "@/app/api/v1/candidates/[id]/galaxies/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, multipartBody, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";

// Reference: tests/fixtures/scripts/galaxies_rank_fixtures.py (numpy/healpy: the greedy 99 % region of the committed
// multi-order 3D map, its galaxies of catalogue.csv, their summed score and the top 25).
const dir = new URL("../fixtures/galaxies/", import.meta.url);
type Top = { name: string; score: number; normalizedScore: number; cumulativeScore: number };
const reference = (JSON.parse(readFileSync(new URL("rank-reference.json", dir), "utf8")) as Record<string, Record<string, { considered: number; top: Top[] }>>).multiorder!;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));

let env: SkymapTestEnv;
let observer: Caller;
let with3d: string;
let with2d: string;
let catalogueId: string;
let southSiteId: string;
let arcticSiteId: string;

beforeAll(async () => {
  env = await setupSkymapTest();
  observer = await createCaller("observer");
  const coordinator = await createCaller("coordinator");
  with3d = (await insertCandidate({ receivedAt: NOW })).id;
  await uploadSkymap({ target: { candidateId: with3d }, fileName: "m3d.fits.gz", bytes: new Uint8Array(readFileSync(new URL("map3d-multiorder.fits.gz", dir))), actorId: coordinator.user.id, via: "ui", now: NOW });
  with2d = (await insertCandidate({ receivedAt: NOW })).id;
  await uploadSkymap({ target: { candidateId: with2d }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: coordinator.user.id, via: "ui", now: NOW });
  const { bytes, contentType } = await multipartBody([{ field: "file", name: "catalogue.csv", bytes: new Uint8Array(readFileSync(new URL("catalogue.csv", dir))) }]);
  const res = await call(cataloguesRoute.POST, { caller: coordinator, body: bytes, headers: { "content-type": contentType } });
  catalogueId = String(res.json.id);
  const db = await getDb();
  const [south] = await db.insert(sites).values({ code: "GXS", name: "Galaxy Test Ridge (fictional)", latitudeDeg: -30, longitudeDeg: 20, elevationM: 2000, minAltitudeDeg: 30, fieldOfViewDeg2: 0.1 }).returning();
  const [arctic] = await db.insert(sites).values({ code: "GXN", name: "Galaxy Test Ice (fictional)", latitudeDeg: 78, longitudeDeg: 15, elevationM: 400, minAltitudeDeg: 30, fieldOfViewDeg2: 0.1 }).returning();
  southSiteId = south!.id;
  arcticSiteId = arctic!.id;
});
afterAll(() => env.cleanup());

const ask = (candidateId: string, search = "", caller: Caller | null = observer) =>
  call(galaxiesRoute.GET.with({ now: () => NOW.getTime() }), { caller: caller ?? undefined, params: { id: candidateId }, url: `http://localhost/api/v1/candidates/${candidateId}/galaxies?${search}` });

interface Answer {
  skymapId: string;
  catalogueId: string;
  consideredRows: number;
  galaxies: Array<Top & { raDeg: number; decDeg: number; distanceMpc: number; weight: number; bestWindow: { start: string; end: string } | null }>;
}

describe("GET /api/v1/candidates/{id}/galaxies", () => {
  it("ranks the default catalogue's galaxies in the 99 % region as numpy does", async () => {
    const res = await ask(with3d, "limit=25");
    expect(res.status).toBe(200);
    const body = res.json as unknown as Answer;
    expect(body.catalogueId).toBe(catalogueId);
    expect(typeof body.skymapId).toBe("string");
    expect(body.consideredRows).toBe(reference["0.99"]!.considered);
    const ref = reference["0.99"]!.top;
    expect(body.galaxies.map((g) => g.name)).toEqual(ref.map((t) => t.name));
    for (const [i, g] of body.galaxies.entries()) {
      expect(g.score).toBeCloseTo(ref[i]!.score, 12);
      expect(Math.abs(g.normalizedScore - ref[i]!.normalizedScore) / ref[i]!.normalizedScore).toBeLessThan(1e-9);
      expect(Math.abs(g.cumulativeScore - ref[i]!.cumulativeScore) / ref[i]!.cumulativeScore).toBeLessThan(1e-9);
      expect(g.bestWindow).toBeNull();
    }
  });

  it("a named catalogue, a limit and a narrower level", async () => {
    const res = await ask(with3d, `catalogueId=${catalogueId}&limit=3&level=0.9`);
    const body = res.json as unknown as Answer;
    expect(body.consideredRows).toBe(reference["0.9"]!.considered);
    expect(body.galaxies.map((g) => g.name)).toEqual(reference["0.9"]!.top.slice(0, 3).map((t) => t.name));
  });

  it("with a site: the best window lies in the coming night with the galaxy above the site's limit at both ends", async () => {
    const body = (await ask(with3d, `limit=10&siteId=${southSiteId}`)).json as unknown as Answer;
    const site = { latDeg: -30, lonDeg: 20, elevationM: 2000 };
    const nights = astronomicalNights(site, NOW, new Date(NOW.getTime() + 86_400_000));
    const night = nights[0]!;
    let withWindow = 0;
    for (const g of body.galaxies) {
      if (!g.bestWindow) continue;
      withWindow += 1;
      const start = new Date(g.bestWindow.start);
      const end = new Date(g.bestWindow.end);
      expect(end.getTime()).toBeGreaterThan(start.getTime());
      // night edges from a 10-min grid refined by bisection: a minute's slack
      expect(start.getTime()).toBeGreaterThanOrEqual(night.start.getTime() - 60_000);
      expect(end.getTime()).toBeLessThanOrEqual(night.end.getTime() + 60_000);
      for (const t of [start, end, new Date((start.getTime() + end.getTime()) / 2)]) expect(targetAltitudeDeg(g, site, t)).toBeGreaterThan(30 - 0.1);
    }
    expect(withWindow).toBeGreaterThan(0);
    const arctic = (await ask(with3d, `limit=10&siteId=${arcticSiteId}`)).json as unknown as Answer;
    // Dec −10° … −45° never climbs to 30° at latitude 78° N (its highest altitude is 90° − 78° − |dec| < 2°).
    expect(arctic.galaxies.every((g) => g.bestWindow === null)).toBe(true);
  });

  it("refuses: a map without distance columns (409), unknown things (404), an importing catalogue (409), bad query (422)", async () => {
    const flat = await ask(with2d);
    expect(flat.status).toBe(409);
    expect(flat.json.error).toContain("no distance columns");
    expect((await ask("no-such-candidate")).status).toBe(404);
    expect((await ask(with3d, "catalogueId=nope")).status).toBe(404);
    expect((await ask(with3d, "siteId=nope")).status).toBe(404);
    const db = await getDb();
    const [importing] = await db.insert(catalogues).values({ name: "half", state: "importing" }).returning();
    expect((await ask(with3d, `catalogueId=${importing!.id}`)).status).toBe(409);
    for (const q of ["limit=0", "limit=1001", "limit=2.5", "level=0.2", "level=1"]) {
      const res = await ask(with3d, q);
      expect(res.status).toBe(422);
      expect(res.json.error).toContain(q.split("=")[0]);
    }
  });

  it("a catalogue stored before the ranking packs existed gets them on its first ranking, with the same answer", async () => {
    const db = await getDb();
    const [old] = await db.insert(catalogues).values({ name: "imported before packs", state: "ready", rowCount: 3000 }).returning();
    const rows = readFileSync(new URL("catalogue.csv", dir), "utf8").trim().split("\n").slice(1).map((line) => line.split(","));
    for (let at = 0; at < rows.length; at += 500) {
      await db.insert(galaxies).values(
        rows.slice(at, at + 500).map(([name = "", ra, dec, dist, weight]) => ({ catalogueId: old!.id, cell: galaxyCell(Number(ra), Number(dec)), name, raDeg: Number(ra), decDeg: Number(dec), distanceMpc: Number(dist), weight: Number(weight) })),
      );
    }
    const packsOf = async () => (await db.select({ n: count() }).from(galaxyCells).where(eq(galaxyCells.catalogueId, old!.id)))[0]?.n ?? 0;
    expect(await packsOf()).toBe(0);
    const body = (await ask(with3d, `catalogueId=${old!.id}&limit=25`)).json as unknown as Answer;
    expect(body.consideredRows).toBe(reference["0.99"]!.considered);
    expect(body.galaxies.map((g) => g.name)).toEqual(reference["0.99"]!.top.map((t) => t.name));
    const packs = await packsOf();
    expect(packs).toBeGreaterThan(0);
    await ask(with3d, `catalogueId=${old!.id}&limit=1`);
    expect(await packsOf()).toBe(packs);
  });

  it("every role reads; without credentials 401", async () => {
    for (const role of ["shifter", "coordinator", "admin"] as const) expect((await ask(with3d, "limit=1", await createCaller(role))).status).toBe(200);
    expect((await ask(with3d, "", null)).status).toBe(401);
  });
});
