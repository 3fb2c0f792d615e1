import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import { footprintPixels, loadSkymap, placeFootprint, type Footprint } from "@/lib/skymap";
import * as coverageRoute from "@/app/api/v1/candidates/[id]/coverage/route";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import * as taskObservations from "@/app/api/v1/tasks/[id]/observations/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, type PlanAnswer } from "../plans/helpers";
import { insertTask } from "./helpers";

const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const tile: Footprint = { shape: "rectangle", widthDeg: 6, heightDeg: 6 };
const map = loadSkymap(fixtureBytes("bimodal-multiorder.fits.gz")).map;

let env: SkymapTestEnv;
let shifter: Caller;
let siteId: string;
let instrumentId: string;
const plan = (candidateId: string, avoid: string) =>
  call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller: shifter, params: { id: candidateId }, json: { instrumentId, maxPointings: 6, avoid } });

/** Probability of a union of footprints from the map's own pixels (footprint membership is checked against healpy). */
function unionOf(tiles: Array<{ raDeg: number; decDeg: number; footprint: Footprint }>): number {
  const seen = new Set<number>();
  for (const t of tiles) for (const i of footprintPixels(map, placeFootprint(t.footprint, t.raDeg, t.decDeg))) seen.add(i);
  let sum = 0;
  for (const i of seen) sum += map.probability[i] ?? 0;
  return sum;
}

/** A candidate of its own with the fixture map, a task at the test site and these exposures logged through the API. */
async function candidateWithLog(log: Array<{ raDeg: number; decDeg: number; footprint: Footprint }>): Promise<string> {
  const candidateId = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 3_600_000) })).id;
  await uploadSkymap({ target: { candidateId }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
  if (log.length === 0) return candidateId;
  const taskId = await insertTask(candidateId, { siteId });
  const rows = log.map((o, k) => ({ ...o, startTime: new Date(NOW.getTime() - (50 - k) * 60_000).toISOString(), exposureS: 60, filter: "g" }));
  const res = await call(taskObservations.POST.with({ now: () => NOW.getTime() }), { caller: shifter, params: { id: taskId }, json: { observations: rows } });
  if (res.status !== 201) throw new Error(`recording failed: ${JSON.stringify(res.json)}`);
  return candidateId;
}

// Exposures on the brighter lobe of the bimodal fixture (RA 115°–160°, Dec −45°…−10°; tests/fixtures/scripts/skymap_make_fixtures.py).
const logged = [
  { raDeg: 140, decDeg: -25, footprint: tile },
  { raDeg: 146, decDeg: -25, footprint: tile },
  { raDeg: 140, decDeg: -31, footprint: { shape: "circle", radiusDeg: 3 } as Footprint },
];

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  const { site, instrument } = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, timeZone: "Etc/GMT+4", footprint: tile });
  siteId = site.id;
  instrumentId = instrument.id;
});
afterAll(() => env.cleanup());

describe("new plans leave out the observed sky (the plans' avoid hook)", () => {
  it("avoid observed: the plan sets aside exactly what the log covers, and gains only sky beyond it", async () => {
    const candidateId = await candidateWithLog(logged);
    const res = await plan(candidateId, "observed");
    expect(res.status).toBe(201);
    const answer = res.json as unknown as PlanAnswer;
    const covered = (await call(coverageRoute.GET, { caller: shifter, params: { id: candidateId } })).json.coveredProbability as number;
    expect(answer.avoidedProbability).toBeCloseTo(covered, 12);
    expect(answer.avoidedProbability).toBeCloseTo(unionOf(logged), 12);
    const planned = answer.pointings.map((p) => ({ raDeg: p.raDeg, decDeg: p.decDeg, footprint: tile }));
    const gained = answer.pointings.at(-1)?.cumulativeProbability ?? 0;
    expect(unionOf([...logged, ...planned])).toBeCloseTo(unionOf(logged) + gained, 12);
  });

  it("once the best field is observed, a new plan (avoid observed or the default) no longer points there; avoid none still does", async () => {
    const fresh = (await plan(await candidateWithLog([]), "none")).json as unknown as PlanAnswer;
    const best = fresh.pointings[0];
    if (!best) throw new Error("the fresh plan has no pointing");
    const candidateId = await candidateWithLog([{ raDeg: best.raDeg, decDeg: best.decDeg, footprint: tile }]);
    for (const avoid of ["observed", "planned-and-observed"]) {
      const answer = (await plan(candidateId, avoid)).json as unknown as PlanAnswer;
      // the default also sets aside the plan made just before it (an open plan of this candidate)
      if (avoid === "observed") expect(answer.avoidedProbability).toBeCloseTo(best.probability, 12);
      else expect(answer.avoidedProbability).toBeGreaterThan(best.probability);
      expect(answer.pointings.map((p) => [p.raDeg, p.decDeg])).not.toContainEqual([best.raDeg, best.decDeg]);
    }
    const again = (await plan(candidateId, "none")).json as unknown as PlanAnswer;
    expect(again.avoidedProbability).toBe(0);
    expect([again.pointings[0]?.raDeg, again.pointings[0]?.decDeg]).toEqual([best.raDeg, best.decDeg]);
  });
});
