import { existsSync, readFileSync } from "node:fs";
import { gunzipSync } from "node:zlib";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, skymaps, uploads } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";
import { decodeDisplayGrid } from "@/lib/skymap";
import { sha256Hex, storedPath } from "@/lib/storage";
import * as displayRoute from "@/app/api/v1/skymaps/[id]/display/route";
import * as skymapRoute from "@/app/api/v1/skymaps/[id]/route";
import * as uiRoute from "@/app/api/v1/candidates/[id]/skymaps/route";
import { POST as feedSkymap } from "@/app/api/v1/feed/candidates/[source]/[externalId]/skymap/route";
import { signFeedBody } from "@/lib/feed/signature";
import { fixtureBytes, reference, relativeDifference, separationDeg, type ReferenceMap } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, multipartBody, rowCounts, setupSkymapTest, storedFiles, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let coordinator: Caller;
let observer: Caller;
const SECRET = "s".repeat(40);
const NOW_MS = Date.UTC(2030, 2, 20, 12, 0, 0);
const feedRoute = feedSkymap.with({ now: () => NOW_MS, feedSecret: () => SECRET });

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  coordinator = await createCaller("coordinator");
  observer = await createCaller("observer");
});
afterAll(() => env.cleanup());

async function uploadUi(candidateId: string, name: string, bytes: Uint8Array, caller: Caller = shifter) {
  const { bytes: body, contentType } = await multipartBody([{ field: "file", name, bytes }]);
  return call(uiRoute.POST, { caller, params: { id: candidateId }, body, headers: { "content-type": contentType } });
}

async function uploadFeed(source: string, externalId: string, name: string, bytes: Uint8Array, sign = true) {
  const { bytes: body, contentType } = await multipartBody([{ field: "file", name, bytes }]);
  const headers: Record<string, string> = { "content-type": contentType, ...(sign ? signFeedBody(SECRET, body, NOW_MS) : {}) };
  return call(feedRoute, { params: { source, externalId }, body, headers });
}

/** The 201 numbers against healpy + numpy (tests/fixtures/scripts/skymap_make_fixtures.py), within 1 %. */
function expectMatchesReference(json: Record<string, unknown>, ref: ReferenceMap) {
  const answer = json as { totalProbability: number; area50Deg2: number; area90Deg2: number; peak: { raDeg: number; decDeg: number }; warnings: string[] };
  expect(relativeDifference(answer.totalProbability, ref.totalProbability)).toBeLessThan(0.01);
  expect(relativeDifference(answer.area50Deg2, ref.area50Deg2)).toBeLessThan(0.01);
  expect(relativeDifference(answer.area90Deg2, ref.area90Deg2)).toBeLessThan(0.01);
  // the peak is a pixel centre: same pixel as healpy's argmax (pixels of nside 64 are ~0.9° across)
  expect(separationDeg(answer.peak, ref.peak)).toBeLessThan(0.01);
  expect(Array.isArray(answer.warnings)).toBe(true);
}

const forms: Array<[string, string, () => Uint8Array]> = [
  ["flat RING, gzip'd", "bimodal-ring-n128.fits.gz", () => fixtureBytes("bimodal-ring-n128.fits.gz")],
  ["flat NESTED, gzip'd", "bimodal-nested-n64.fits.gz", () => fixtureBytes("bimodal-nested-n64.fits.gz")],
  ["multi-order, gzip'd", "bimodal-multiorder.fits.gz", () => fixtureBytes("bimodal-multiorder.fits.gz")],
  ["flat RING, plain FITS", "bimodal-ring-n128.fits.gz", () => new Uint8Array(gunzipSync(fixtureBytes("bimodal-ring-n128.fits.gz")))],
  ["single blob, NESTED", "single-nested-n128.fits.gz", () => fixtureBytes("single-nested-n128.fits.gz")],
];

describe("upload from the candidate page (bearer token)", () => {
  it.each(forms)("%s: 201 with the healpy figures, file and grid stored, rows and event written", async (_label, refName, bytes) => {
    const candidate = await insertCandidate();
    const data = bytes();
    const res = await uploadUi(candidate.id, "map.fits", data);
    expect(res.status).toBe(201);
    expectMatchesReference(res.json, reference.maps[refName] as ReferenceMap);
    const sha256 = res.json.sha256 as string;
    expect(sha256).toBe(sha256Hex(data));
    expect(Buffer.compare(readFileSync(storedPath(sha256)), Buffer.from(data))).toBe(0);
    expect(existsSync(storedPath(sha256, "grid64"))).toBe(true);

    const db = await getDb();
    const [row] = await db.select().from(skymaps).where(eq(skymaps.id, res.json.id as string));
    expect(row?.candidateId).toBe(candidate.id);
    expect(row?.revisionId).toBe(candidate.revisionId);
    const [event] = await db.select().from(events).where(eq(events.kind, eventKinds.skymapUploaded)).orderBy(events.id);
    expect(event).toBeDefined();
    const mine = (await db.select().from(events).where(eq(events.candidateId, candidate.id))).filter((e) => e.kind === eventKinds.skymapUploaded);
    expect(mine).toHaveLength(1);
    expect(mine[0]?.actorId).toBe(shifter.user.id);
    expect(mine[0]?.data).toMatchObject({ skymapId: res.json.id, via: "ui" });
  });

  it("normalises a total that is not 1 and says so in the warnings", async () => {
    const ref = reference.maps["bimodal-ring-n128.fits.gz"] as ReferenceMap;
    expect(Math.abs(ref.totalProbability - 1)).toBeGreaterThan(1e-3); // the fixture is made that way
    const candidate = await insertCandidate();
    const res = await uploadUi(candidate.id, "ring.fits.gz", fixtureBytes("bimodal-ring-n128.fits.gz"));
    expect(res.status).toBe(201);
    expect((res.json.warnings as string[]).join(" ")).toMatch(/normalis/i);
  });

  it("stores identical bytes once and lists the candidate's maps newest first", async () => {
    const candidate = await insertCandidate();
    const data = fixtureBytes("bimodal-nested-n64.fits.gz");
    const first = await uploadUi(candidate.id, "a.fits.gz", data);
    const second = await uploadUi(candidate.id, "b.fits.gz", data, coordinator);
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.json.sha256).toBe(first.json.sha256);
    expect(storedFiles(env.uploadDir).filter((f) => f.endsWith(first.json.sha256 as string))).toHaveLength(1);
    const list = await call(uiRoute.GET, { caller: observer, params: { id: candidate.id } });
    const maps = list.json.skymaps as Array<{ id: string; file: { name: string } }>;
    expect(maps.map((m) => m.file.name)).toEqual(["b.fits.gz", "a.fits.gz"]);
    const one = await call(skymapRoute.GET, { caller: observer, params: { id: first.json.id as string } });
    expect((one.json.skymap as { area90Deg2: number }).area90Deg2).toBeCloseTo(first.json.area90Deg2 as number, 9);
  });

  it("serves the stored display grid, which decodes to a full-sky nside-64 grid", async () => {
    const candidate = await insertCandidate();
    const up = await uploadUi(candidate.id, "m.fits.gz", fixtureBytes("bimodal-multiorder.fits.gz"));
    const res = await call(displayRoute.GET, { caller: observer, params: { id: up.json.id as string } });
    expect(res.status).toBe(200);
    const grid = decodeDisplayGrid(new Uint8Array(await res.res.arrayBuffer()));
    expect(grid.nside).toBe(64);
    const sum = grid.probability.reduce((a, b) => a + b, 0);
    expect(sum).toBeCloseTo(1, 9);
  });

  it("refuses observers (403) and strangers (401), writing nothing", async () => {
    const candidate = await insertCandidate();
    const before = await rowCounts();
    const files = storedFiles(env.uploadDir);
    const refused = await uploadUi(candidate.id, "m.fits.gz", fixtureBytes("bimodal-nested-n64.fits.gz"), observer);
    expect(refused.status).toBe(403);
    const { bytes: body, contentType } = await multipartBody([{ field: "file", name: "m.fits", bytes: fixtureBytes("bimodal-nested-n64.fits.gz") }]);
    const anonymous = await call(uiRoute.POST, { params: { id: candidate.id }, body, headers: { "content-type": contentType } });
    expect(anonymous.status).toBe(401);
    expect(await rowCounts()).toEqual(before);
    expect(storedFiles(env.uploadDir)).toEqual(files);
  });

  it("answers 404 for an unknown candidate and stores nothing", async () => {
    const files = storedFiles(env.uploadDir);
    const res = await uploadUi("no-such-candidate", "m.fits.gz", fixtureBytes("single-nested-n128.fits.gz"));
    expect(res.status).toBe(404);
    expect(storedFiles(env.uploadDir)).toEqual(files);
  });
});

describe("upload by the feed (signature over the raw multipart bytes)", () => {
  it("accepts a signed upload for a known candidate with the healpy figures", async () => {
    const candidate = await insertCandidate();
    const res = await uploadFeed(candidate.source, candidate.externalId, "feed.fits.gz", fixtureBytes("bimodal-multiorder.fits.gz"));
    expect(res.status).toBe(201);
    expectMatchesReference(res.json, reference.maps["bimodal-multiorder.fits.gz"] as ReferenceMap);
    const db = await getDb();
    const [upload] = await db
      .select()
      .from(uploads)
      .innerJoin(skymaps, eq(skymaps.uploadId, uploads.id))
      .where(eq(skymaps.id, res.json.id as string));
    expect(upload?.uploads.uploadedById).toBeNull();
    expect(upload?.uploads.mimeType).toBe("application/gzip");
  });

  it("refuses an unsigned, a wrongly signed, a stale and a tampered body with 401, keeping nothing", async () => {
    const candidate = await insertCandidate();
    const before = await rowCounts();
    const files = storedFiles(env.uploadDir);
    const data = fixtureBytes("single-nested-n128.fits.gz");
    expect((await uploadFeed(candidate.source, candidate.externalId, "x.fits.gz", data, false)).status).toBe(401);

    const { bytes: body, contentType } = await multipartBody([{ field: "file", name: "x.fits.gz", bytes: data }]);
    const wrongKey = signFeedBody("k".repeat(40), body, NOW_MS);
    const stale = signFeedBody(SECRET, body, NOW_MS - 10 * 60_000);
    const tampered = body.slice();
    tampered[tampered.length - 100] = (tampered[tampered.length - 100] ?? 0) ^ 0xff;
    const good = signFeedBody(SECRET, body, NOW_MS);
    for (const [headers, payload] of [
      [wrongKey, body],
      [stale, body],
      [good, tampered],
    ] as const) {
      const res = await call(feedRoute, {
        params: { source: candidate.source, externalId: candidate.externalId },
        body: payload,
        headers: { "content-type": contentType, ...headers },
      });
      expect(res.status).toBe(401);
      expect(res.json.error).toMatch(/signature/);
    }
    expect(await rowCounts()).toEqual(before);
    expect(storedFiles(env.uploadDir)).toEqual(files);
  });

  it("answers 404 for a candidate the feed never posted", async () => {
    const res = await uploadFeed("test-pipe", "NOPE-1", "x.fits.gz", fixtureBytes("single-nested-n128.fits.gz"));
    expect(res.status).toBe(404);
    expect(res.json.error).toMatch(/test-pipe\/NOPE-1/);
  });
});
