import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import * as distanceRoute from "@/app/api/v1/skymaps/[id]/distance/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

// Reference: tests/fixtures/scripts/galaxies_make_fixtures.py — healpy.ang2pix picks the pixel of each probe, and
// scipy.integrate.quad gives the mean and sd of r² N(r; DISTMU, DISTSIGMA) there (Singer et al. 2016 ansatz).
const galaxies = new URL("../fixtures/galaxies/", import.meta.url);
const probes = (JSON.parse(readFileSync(new URL("reference.json", galaxies), "utf8")) as {
  flat: { probes: Array<{ raDeg: number; decDeg: number; meanMpc: number; stdMpc: number }> };
}).flat.probes;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));

let env: SkymapTestEnv;
let shifter: Caller;
let map3d: string;
let map2d: string;

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  const a = (await insertCandidate({ receivedAt: NOW })).id;
  const bytes = new Uint8Array(readFileSync(new URL("map3d-nested-n32.fits.gz", galaxies)));
  map3d = (await uploadSkymap({ target: { candidateId: a }, fileName: "n32.fits.gz", bytes, actorId: shifter.user.id, via: "ui", now: NOW })).id;
  const b = (await insertCandidate({ receivedAt: NOW })).id;
  map2d = (await uploadSkymap({ target: { candidateId: b }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW })).id;
});
afterAll(() => env.cleanup());

const ask = (id: string, search: string, caller: Caller | null = shifter) =>
  call(distanceRoute.GET, { caller: caller ?? undefined, params: { id }, url: `http://localhost/api/v1/skymaps/${id}/distance?${search}` });

describe("GET /api/v1/skymaps/{id}/distance", () => {
  for (const p of probes) {
    it(`at RA ${p.raDeg}°, Dec ${p.decDeg}° matches scipy`, async () => {
      const res = await ask(map3d, `raDeg=${p.raDeg}&decDeg=${p.decDeg}`);
      expect(res.status).toBe(200);
      const d = res.json.distance as { meanMpc: number; stdMpc: number } | null;
      expect(Math.abs((d?.meanMpc ?? 0) - p.meanMpc) / p.meanMpc).toBeLessThan(1e-8);
      expect(Math.abs((d?.stdMpc ?? 0) - p.stdMpc) / p.stdMpc).toBeLessThan(1e-7);
    });
  }

  it("says 409 for a map without distance columns, 422 naming a bad coordinate, 401 without a session", async () => {
    const flat = await ask(map2d, "raDeg=120&decDeg=-30");
    expect(flat.status).toBe(409);
    expect(flat.json.error).toMatch(/distance/);
    const bad = await ask(map3d, "raDeg=120&decDeg=-95");
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.json)).toMatch(/decDeg/);
    expect((await ask(map3d, "raDeg=120&decDeg=-30", null)).status).toBe(401);
  });
});
