import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import type { Footprint } from "@/lib/skymap";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, type PlanAnswer } from "./helpers";

/** A plan keeps the least Moon distance of its instrument's site (the sites' setting), not a fixed 20°. */
let env: SkymapTestEnv;
let shifter: Caller;
let candidateId: string;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const wide: Footprint = { shape: "rectangle", widthDeg: 10, heightDeg: 10 };

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  candidateId = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 3_600_000) })).id;
  await uploadSkymap({ target: { candidateId }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
});
afterAll(() => env.cleanup());

const plan = async (instrumentId: string) => {
  const res = await call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller: shifter, params: { id: candidateId }, json: { instrumentId, avoid: "none" } });
  expect(res.status).toBe(201);
  return res.json as unknown as PlanAnswer;
};

describe("the site's Moon distance in plans", () => {
  it("schedules with the default 20° and schedules nothing when the site asks for 180° from the Moon", async () => {
    const usual = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, footprint: wide });
    const strict = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, footprint: wide, moonDistanceDeg: 180 });
    const a = await plan(usual.instrument.id);
    const b = await plan(strict.instrument.id);
    expect(a.pointings.some((p) => p.plannedStart !== null)).toBe(true);
    expect(b.pointings.map((p) => p.raDeg)).toEqual(a.pointings.map((p) => p.raDeg));
    expect(b.pointings.every((p) => p.plannedStart === null)).toBe(true);
    expect(b.scheduledProbability).toBe(0);
    // every pointing the usual site could schedule is refused for the Moon at the strict one
    const scheduledAtUsual = new Set(a.pointings.filter((p) => p.plannedStart !== null).map((p) => p.index));
    for (const p of b.pointings) if (scheduledAtUsual.has(p.index)) expect(p.unscheduledReason).toBe("too-close-to-moon");
  });
});
