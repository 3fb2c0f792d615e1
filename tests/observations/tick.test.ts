import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { events, observations } from "@/db/schema";
import { uploadSkymap } from "@/lib/data/skymaps";
import { eventKinds } from "@/lib/events/kinds";
import type { Footprint } from "@/lib/skymap";
import * as coverageRoute from "@/app/api/v1/candidates/[id]/coverage/route";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import * as tickRoute from "@/app/api/v1/plans/[id]/pointings/[pointingId]/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, type PlanAnswer } from "../plans/helpers";

const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));
const TICK = new Date(NOW.getTime() + 3_600_000);
const tile: Footprint = { shape: "rectangle", widthDeg: 5, heightDeg: 5 };

let env: SkymapTestEnv;
const who = {} as Record<"observer" | "outsider" | "coordinator", Caller>;
let site: Awaited<ReturnType<typeof insertSiteWithInstrument>>;

const tick = (caller: Caller, planId: string, pointingId: string, done: boolean) =>
  call(tickRoute.PATCH.with({ now: () => TICK.getTime() }), { caller, method: "PATCH", params: { id: planId, pointingId }, json: { done } });
const covered = async (candidateId: string) => (await call(coverageRoute.GET, { caller: who.coordinator, params: { id: candidateId } })).json.coveredProbability as number;

/** A candidate of its own with the fixture map and a three-pointing plan of the test site's instrument. */
async function planned(): Promise<{ candidateId: string; plan: PlanAnswer }> {
  const candidateId = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 3_600_000) })).id;
  await uploadSkymap({ target: { candidateId }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: null, via: "ui", now: NOW });
  const res = await call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller: who.coordinator, params: { id: candidateId }, json: { instrumentId: site.instrument.id, maxPointings: 3, avoid: "none" } });
  if (res.status !== 201) throw new Error(JSON.stringify(res.json));
  return { candidateId, plan: res.json as unknown as PlanAnswer };
}

beforeAll(async () => {
  env = await setupSkymapTest();
  for (const role of ["observer", "coordinator"] as const) who[role] = await createCaller(role);
  who.outsider = await createCaller("observer");
  site = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, timeZone: "Etc/GMT+4", footprint: tile, filters: ["i", "z"], observerIds: [who.observer.user.id] });
});
afterAll(() => env.cleanup());

describe("ticking a planned pointing records its exposure", () => {
  it("one tick: an observation at the planned tile with the plan's defaults, ending at the tick, and coverage rises by the tile", async () => {
    const { candidateId, plan } = await planned();
    const target = plan.pointings[0];
    if (!target) throw new Error("no pointing");
    expect(await covered(candidateId)).toBe(0);
    expect((await tick(who.observer, plan.id, target.id, true)).status).toBe(200);
    const db = await getDb();
    const rows = await db.select().from(observations).where(eq(observations.candidateId, candidateId));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ source: "tick", raDeg: target.raDeg, decDeg: target.decDeg, footprint: tile, exposureS: plan.exposureS, filter: "i", pointingIndex: target.index, instrumentId: site.instrument.id, siteId: site.site.id, recordedById: who.observer.user.id });
    expect(rows[0]?.startTime.getTime()).toBe(TICK.getTime() - plan.exposureS * 1000);
    // the first tile's own probability is the whole union of a one-exposure log
    expect(await covered(candidateId)).toBeCloseTo(target.probability, 12);
    const audit = (await db.select().from(events).where(eq(events.kind, eventKinds.observationsRecorded))).filter((e) => e.candidateId === candidateId);
    expect(audit.map((e) => e.data)).toEqual([{ count: 1, via: "tick", siteIds: [site.site.id], planId: plan.id, pointingIndex: target.index }]);
  });

  it("a repeated tick records nothing more; taking it back removes the exposure (audited) and coverage falls back", async () => {
    const { candidateId, plan } = await planned();
    const [first, second] = plan.pointings;
    if (!first || !second) throw new Error("two pointings needed");
    await tick(who.observer, plan.id, first.id, true);
    await tick(who.observer, plan.id, first.id, true);
    await tick(who.coordinator, plan.id, second.id, true);
    const db = await getDb();
    expect(await db.select().from(observations).where(eq(observations.candidateId, candidateId))).toHaveLength(2);
    expect(await covered(candidateId)).toBeCloseTo(first.probability + second.gainedProbability, 12);
    expect((await tick(who.coordinator, plan.id, first.id, false)).status).toBe(200);
    const left = await db.select().from(observations).where(eq(observations.candidateId, candidateId));
    expect(left.map((o) => o.pointingIndex)).toEqual([second.index]);
    expect(await covered(candidateId)).toBeCloseTo(second.probability, 12);
    const withdrawn = (await db.select().from(events).where(eq(events.kind, eventKinds.observationsWithdrawn))).filter((e) => e.candidateId === candidateId);
    expect(withdrawn).toHaveLength(1);
  });

  it("a refused tick records nothing", async () => {
    const { candidateId, plan } = await planned();
    const target = plan.pointings[0];
    if (!target) throw new Error("no pointing");
    expect((await tick(who.outsider, plan.id, target.id, true)).status).toBe(403);
    const db = await getDb();
    expect(await db.select().from(observations).where(eq(observations.candidateId, candidateId))).toHaveLength(0);
  });
});
