import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ApiError } from "@/lib/api/errors";
import { readBodyBytes } from "@/lib/storage";
import * as uiRoute from "@/app/api/v1/candidates/[id]/skymaps/route";
import { POST as feedSkymap } from "@/app/api/v1/feed/candidates/[source]/[externalId]/skymap/route";
import { signFeedBody } from "@/lib/feed/signature";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, multipartBody, rowCounts, setupSkymapTest, storedFiles, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let candidate: Awaited<ReturnType<typeof insertCandidate>>;
const SECRET = "f".repeat(48);
const NOW_MS = Date.UTC(2030, 2, 20, 12, 0, 0);
const feedRoute = feedSkymap.with({ now: () => NOW_MS, feedSecret: () => SECRET });

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  candidate = await insertCandidate();
});
afterAll(() => env.cleanup());

async function expectNothingKept<T>(fn: () => Promise<T>): Promise<T> {
  const before = await rowCounts();
  const files = storedFiles(env.uploadDir);
  const result = await fn();
  expect(await rowCounts()).toEqual(before);
  expect(storedFiles(env.uploadDir)).toEqual(files);
  return result;
}

// Each malformed file is broken one way by tests/fixtures/scripts/skymap_make_fixtures.py.
const malformed: Array<[string, number, RegExp]> = [
  ["truncated-data.fits", 422, /truncated|file ends/i],
  ["truncated-header.fits", 422, /ends inside the header/],
  ["truncated.fits.gz", 422, /gzip stream is truncated or corrupt/],
  ["wrong-first-card.fits", 415, /not a FITS file/],
  ["nans.fits", 422, /NaN/],
  ["negative.fits", 422, /negative probabilities/],
  ["bad-ordering.fits", 422, /ORDERING must be RING, NESTED or NUNIQ, got SPIRAL/],
  ["galactic.fits", 422, /COORDSYS G/],
  ["all-zero.fits", 422, /sum to zero/],
  ["multiorder-overlap.fits", 422, /overlap/],
];

describe("malformed sky maps get a 4xx naming the fault and leave no row or file", () => {
  it.each(malformed)("%s from the candidate page → %i", async (name, status, message) => {
    const res = await expectNothingKept(async () => {
      const { bytes, contentType } = await multipartBody([{ field: "file", name, bytes: fixtureBytes(`malformed/${name}`) }]);
      return call(uiRoute.POST, { caller: shifter, params: { id: candidate.id }, body: bytes, headers: { "content-type": contentType } });
    });
    expect(res.status).toBe(status);
    expect(res.json.error).toMatch(/^sky map refused: /);
    expect(res.json.error).toMatch(message);
    expect(typeof res.json.code).toBe("string");
  });

  it.each(malformed)("%s from the feed → %i", async (name, status, message) => {
    const res = await expectNothingKept(async () => {
      const { bytes, contentType } = await multipartBody([{ field: "file", name, bytes: fixtureBytes(`malformed/${name}`) }]);
      const headers = { "content-type": contentType, ...signFeedBody(SECRET, bytes, NOW_MS) };
      return call(feedRoute, { params: { source: candidate.source, externalId: candidate.externalId }, body: bytes, headers });
    });
    expect(res.status).toBe(status);
    expect(res.json.error).toMatch(message);
  });

  it("refuses plain text as the wrong type (415)", async () => {
    const res = await expectNothingKept(async () => {
      const { bytes, contentType } = await multipartBody([{ field: "file", name: "notes.txt", bytes: new TextEncoder().encode("a sky map, honest") }]);
      return call(uiRoute.POST, { caller: shifter, params: { id: candidate.id }, body: bytes, headers: { "content-type": contentType } });
    });
    expect(res.status).toBe(415);
  });
});

describe("the request itself", () => {
  it("refuses a body that is not multipart with 415", async () => {
    const res = await expectNothingKept(() =>
      call(uiRoute.POST, {
        caller: shifter,
        params: { id: candidate.id },
        body: new Uint8Array(fixtureBytes("malformed/good-n16.fits")),
        headers: { "content-type": "application/fits" },
      }),
    );
    expect(res.status).toBe(415);
    expect(res.json.error).toMatch(/multipart\/form-data/);
  });

  it("wants exactly one file in the field named file (422)", async () => {
    const good = fixtureBytes("malformed/good-n16.fits");
    for (const files of [
      [{ field: "upload", name: "a.fits", bytes: good }],
      [
        { field: "file", name: "a.fits", bytes: good },
        { field: "file", name: "b.fits", bytes: good },
      ],
    ]) {
      const res = await expectNothingKept(async () => {
        const { bytes, contentType } = await multipartBody(files);
        return call(uiRoute.POST, { caller: shifter, params: { id: candidate.id }, body: bytes, headers: { "content-type": contentType } });
      });
      expect(res.status).toBe(422);
      expect(res.json.error).toMatch(/"file"/);
    }
  });

  it("refuses a declared Content-Length over 200 MB with 413 before reading", async () => {
    const { bytes, contentType } = await multipartBody([{ field: "file", name: "a.fits", bytes: fixtureBytes("malformed/good-n16.fits") }]);
    const res = await expectNothingKept(() =>
      call(uiRoute.POST, {
        caller: shifter,
        params: { id: candidate.id },
        body: bytes,
        headers: { "content-type": contentType, "content-length": String(201 * 1024 * 1024) },
      }),
    );
    expect(res.status).toBe(413);
  });

  it("cuts off a streamed body once it passes the limit (no Content-Length)", async () => {
    let pulled = 0;
    const stream = new ReadableStream<Uint8Array>({
      pull(controller) {
        pulled += 1;
        if (pulled > 100) controller.close();
        else controller.enqueue(new Uint8Array(1000));
      },
    });
    const req = new Request("http://localhost/", { method: "POST", body: stream, duplex: "half" } as RequestInit);
    const error = await readBodyBytes(req, 5_500).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect((error as ApiError).status).toBe(413);
    expect(pulled).toBeLessThan(10); // stopped reading, did not drain the stream
  });
});
