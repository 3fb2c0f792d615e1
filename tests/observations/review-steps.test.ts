import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { candidates } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { CoverageMask } from "@/lib/coverage";
import { uploadSkymap } from "@/lib/data/skymaps";
import { setReviewClock } from "@/lib/review/clock";
import { loadReviewScope } from "@/lib/review/report";
import { loadSkymap, type Footprint } from "@/lib/skymap";
import { GET as exportReview } from "@/app/api/v1/review/export/route";
import * as taskObservations from "@/app/api/v1/tasks/[id]/observations/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSite, insertTask } from "./helpers";

const T0 = Date.UTC(2030, 2, 20, 0, 0, 0); // every candidate's merger and receipt
const NOW = T0 + 12 * 3_600_000;
const FILE = "bimodal-ring-n128.fits.gz";
const map = loadSkymap(fixtureBytes(FILE)).map;

// A hand-made night: a small tile, a wide disc on the two lobes, then a hemisphere. The 50 % crossing is the disc's
// end and the 90 % crossing the hemisphere's end; the test first checks the log really crosses there.
const peak = { raDeg: 137, decDeg: -27 };
const log: Array<{ footprint: Footprint; startMin: number; exposureS: number }> = [
  { footprint: { shape: "rectangle", widthDeg: 2, heightDeg: 2 }, startMin: 75, exposureS: 60 }, // 01:15–01:16
  { footprint: { shape: "circle", radiusDeg: 20 }, startMin: 130, exposureS: 600 }, // 02:10–02:20
  { footprint: { shape: "circle", radiusDeg: 90 }, startMin: 300, exposureS: 300 }, // 05:00–05:05
];

let env: SkymapTestEnv;
let observer: Caller;
let observed: string;
let noMap: string;
let dismissed: string;

beforeAll(async () => {
  env = await setupSkymapTest();
  observer = await createCaller("observer");
  const site = await insertSite([{ shape: "circle", radiusDeg: 1 }], [observer.user.id]);
  const at = new Date(T0);
  observed = (await insertCandidate({ receivedAt: at })).id;
  noMap = (await insertCandidate({ receivedAt: at })).id;
  dismissed = (await insertCandidate({ receivedAt: at })).id;
  await getDb().then((db) => db.update(candidates).set({ triageState: "dismissed", decidedAt: new Date(T0 + 600_000) }).where(eq(candidates.id, dismissed)));
  await uploadSkymap({ target: { candidateId: observed }, fileName: FILE, bytes: fixtureBytes(FILE), actorId: null, via: "ui", now: new Date(T0 + 60_000) });
  const task = await insertTask(observed, { siteId: site.id, claimedById: observer.user.id });
  await insertTask(noMap, { siteId: site.id });
  const rows = log.map((o) => ({ ...peak, footprint: o.footprint, startTime: new Date(T0 + o.startMin * 60_000).toISOString(), exposureS: o.exposureS, filter: "r" }));
  const res = await call(taskObservations.POST.with({ now: () => NOW }), { caller: observer, params: { id: task }, json: { observations: rows } });
  if (res.status !== 201) throw new Error(JSON.stringify(res.json));
  setReviewClock(() => NOW);
});
afterAll(async () => {
  setReviewClock(null);
  await env.cleanup();
});

describe("review steps merger → first exposure, → 50 %, → 90 % observed", () => {
  it("the hand-made log crosses 50 % with the disc and 90 % with the hemisphere (precondition)", () => {
    const mask = new CoverageMask(map);
    const after = log.map((o) => {
      mask.add(o.footprint, peak.raDeg, peak.decDeg);
      return mask.coveredProbability;
    });
    expect(after[0]).toBeLessThan(0.5);
    expect(after[1]).toBeGreaterThanOrEqual(0.5);
    expect(after[1]).toBeLessThan(0.9);
    expect(after[2]).toBeGreaterThanOrEqual(0.9);
  });

  it("times each from the merger: the first start, and the ends of the exposures that crossed 50 % and 90 %", async () => {
    const scope = await loadReviewScope({ fromMs: T0 - 3_600_000, toMs: T0 + 3_600_000, nowMs: NOW, timeZone: "UTC" });
    const row = scope?.rows.find((r) => r.facts.id === observed);
    expect(row?.steps.exposure).toMatchObject({ status: "done", startMs: T0, durationMs: 75 * 60_000, actorId: observer.user.id });
    expect(row?.steps.covered50).toMatchObject({ status: "done", durationMs: 140 * 60_000 });
    expect(row?.steps.covered90).toMatchObject({ status: "done", durationMs: 305 * 60_000 });
    // default deadlines: first exposure 2 h, 50 % 12 h, 90 % 48 h
    expect([row?.steps.exposure.overDeadline, row?.steps.covered50.overDeadline, row?.steps.covered90.overDeadline]).toEqual([false, false, false]);
    expect(scope?.curves.map((c) => c.candidateId)).toEqual([observed]);
    expect(scope?.curves[0]?.points.map((p) => p.secondsSinceMerger)).toEqual([76 * 60, 140 * 60, 305 * 60]);
  });

  it("a followed-up candidate with no exposure is open (and late past 2 h); with no sky map the coverage steps are skipped; a dismissed one skips all", async () => {
    const scope = await loadReviewScope({ fromMs: T0 - 3_600_000, toMs: T0 + 3_600_000, nowMs: NOW, timeZone: "UTC" });
    const pending = scope?.rows.find((r) => r.facts.id === noMap);
    expect(pending?.steps.exposure).toMatchObject({ status: "open", durationMs: NOW - T0, overDeadline: true });
    expect(pending?.steps.covered50).toMatchObject({ status: "skipped", note: "no sky map" });
    const gone = scope?.rows.find((r) => r.facts.id === dismissed);
    for (const step of ["exposure", "covered50", "covered90"] as const) expect(gone?.steps[step]).toMatchObject({ status: "skipped", note: "decided dismissed" });
  });

  it("the CSV export carries the three steps' status, seconds and lateness", async () => {
    const { token } = await createApiToken(observer.user.id, "review export");
    const res = await exportReview(new NextRequest("http://localhost/api/v1/review/export?from=2030-03-19&to=2030-03-21", { headers: { authorization: `Bearer ${token}` } }));
    expect(res.status).toBe(200);
    const [header, ...lines] = (await res.text()).trim().split("\r\n");
    const columns = (header ?? "").split(",");
    const line = lines.find((l) => l.startsWith(observed))?.split(",") ?? [];
    const cell = (name: string) => line[columns.indexOf(name)];
    expect([cell("exposure_status"), cell("exposure_seconds"), cell("exposure_over_deadline")]).toEqual(["done", "4500", "false"]);
    expect([cell("covered50_status"), cell("covered50_seconds")]).toEqual(["done", "8400"]);
    expect([cell("covered90_status"), cell("covered90_seconds")]).toEqual(["done", "18300"]);
  });
});
