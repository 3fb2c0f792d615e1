import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as coneRoute from "@/app/api/v1/skymaps/[id]/cone/route";
import * as uiRoute from "@/app/api/v1/candidates/[id]/skymaps/route";
import { fixtureBytes, reference, type ReferenceMap } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, multipartBody, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let observer: Caller;
const ids = new Map<string, string>();
const names = ["bimodal-ring-n128.fits.gz", "bimodal-nested-n64.fits.gz", "bimodal-multiorder.fits.gz", "single-nested-n128.fits.gz"];

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  observer = await createCaller("observer");
  for (const name of names) {
    const candidate = await insertCandidate();
    const { bytes, contentType } = await multipartBody([{ field: "file", name, bytes: fixtureBytes(name) }]);
    const res = await call(uiRoute.POST, { caller: shifter, params: { id: candidate.id }, body: bytes, headers: { "content-type": contentType } });
    if (res.status !== 201) throw new Error(`upload of ${name} answered ${res.status}: ${res.json.error}`);
    ids.set(name, res.json.id as string);
  }
});
afterAll(() => env.cleanup());

function cone(id: string, q: Record<string, string | number>, caller: Caller = observer) {
  const search = new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)]));
  return call(coneRoute.GET, { caller, params: { id }, url: `http://localhost/api/v1/skymaps/${id}/cone?${search}` });
}

describe("GET /api/v1/skymaps/:id/cone", () => {
  // Reference: healpy query_disc(inclusive=False) sums, tests/fixtures/scripts/skymap_make_fixtures.py
  it.each(names)("%s: every reference cone within 1 % of healpy (absolute 1e-4 near zero)", async (name) => {
    const ref = reference.maps[name] as ReferenceMap;
    for (const c of ref.cones) {
      const res = await cone(ids.get(name) ?? "", { raDeg: c.raDeg, decDeg: c.decDeg, radiusDeg: c.radiusDeg });
      expect(res.status).toBe(200);
      const probability = res.json.probability as number;
      const tolerance = Math.max(0.01 * c.probability, 1e-4);
      expect(Math.abs(probability - c.probability), `${name} cone ${JSON.stringify(c)}`).toBeLessThanOrEqual(tolerance);
    }
  });

  it.each([
    [{ raDeg: 10, decDeg: 95, radiusDeg: 5 }, "decDeg"],
    [{ raDeg: 10, decDeg: -91, radiusDeg: 5 }, "decDeg"],
    [{ raDeg: -1, decDeg: 0, radiusDeg: 5 }, "raDeg"],
    [{ raDeg: 361, decDeg: 0, radiusDeg: 5 }, "raDeg"],
    [{ raDeg: 10, decDeg: 0, radiusDeg: 0 }, "radiusDeg"],
    [{ raDeg: 10, decDeg: 0, radiusDeg: 200 }, "radiusDeg"],
    [{ raDeg: "abc", decDeg: 0, radiusDeg: 5 }, "raDeg"],
    [{ decDeg: 0, radiusDeg: 5 }, "raDeg"],
  ])("answers 422 naming the field for %j", async (q, field) => {
    const res = await cone(ids.get(names[0] ?? "") ?? "", q);
    expect(res.status).toBe(422);
    expect((res.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain(field);
  });

  it("answers 404 for an unknown map and 401 without a token", async () => {
    expect((await cone("nope", { raDeg: 1, decDeg: 1, radiusDeg: 1 })).status).toBe(404);
    const id = ids.get(names[0] ?? "") ?? "";
    const anonymous = await call(coneRoute.GET, { params: { id }, url: `http://localhost/x?raDeg=1&decDeg=1&radiusDeg=1` });
    expect(anonymous.status).toBe(401);
  });
});
