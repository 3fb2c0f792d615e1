import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import * as skymapsRoute from "@/app/api/v1/candidates/[id]/skymaps/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

// Reference: tests/fixtures/scripts/galaxies_make_fixtures.py (scipy quadrature / Simpson's rule, Singer et al. 2016).
const galaxies = new URL("../fixtures/galaxies/", import.meta.url);
const reference = JSON.parse(readFileSync(new URL("reference.json", galaxies), "utf8")) as {
  multiorder: { whole: { meanMpc: number; stdMpc: number }; peak: { meanMpc: number; stdMpc: number } };
};
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));

let env: SkymapTestEnv;
let shifter: Caller;

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
});
afterAll(() => env.cleanup());

interface Listed {
  skymaps: Array<{ distance: { meanMpc: number; stdMpc: number; atPeak: { meanMpc: number; stdMpc: number } | null } | null }>;
}

describe("a stored sky map keeps its distance summary", () => {
  it("a 3D map lists its whole-map and most-probable-position distance", async () => {
    const id = (await insertCandidate({ receivedAt: NOW })).id;
    const bytes = new Uint8Array(readFileSync(new URL("map3d-multiorder.fits.gz", galaxies)));
    await uploadSkymap({ target: { candidateId: id }, fileName: "m3d.fits.gz", bytes, actorId: shifter.user.id, via: "ui", now: NOW });
    const res = await call(skymapsRoute.GET, { caller: shifter, params: { id } });
    expect(res.status).toBe(200);
    const d = (res.json as unknown as Listed).skymaps[0]?.distance;
    expect(d?.meanMpc).toBeCloseTo(reference.multiorder.whole.meanMpc, 3);
    expect(d?.stdMpc).toBeCloseTo(reference.multiorder.whole.stdMpc, 3);
    expect(d?.atPeak?.meanMpc).toBeCloseTo(reference.multiorder.peak.meanMpc, 6);
    expect(d?.atPeak?.stdMpc).toBeCloseTo(reference.multiorder.peak.stdMpc, 6);
  });

  it("a map without distance columns lists none", async () => {
    const id = (await insertCandidate({ receivedAt: NOW })).id;
    await uploadSkymap({ target: { candidateId: id }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
    const res = await call(skymapsRoute.GET, { caller: shifter, params: { id } });
    expect((res.json as unknown as Listed).skymaps[0]?.distance).toBeNull();
  });
});
