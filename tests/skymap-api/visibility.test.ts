import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createSite } from "@/lib/services/manage-sites";
import { uploadSkymap } from "@/lib/data/skymaps";
import { candidateVisibility, compareVisibilityRows, suggestTasks, taskKindForFieldOfView, tonightOverview } from "@/lib/data/visibility";
import { siteFormSchema } from "@/lib/validations/sites";
import * as suggestionsRoute from "@/app/api/v1/candidates/[id]/suggestions/route";
import * as visibilityRoute from "@/app/api/v1/candidates/[id]/visibility/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
let shifter: Caller;
let observer: Caller;
let withMap: string;
let withoutMap: string;
// An injected clock: 2030 March equinox, noon UTC (no test reads the wall clock for figures).
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));

// Fictional sites. The bimodal map's 90 % region lies at declinations about −45° … −10° (RA ≈ 115°–160°).
const sites = {
  southWide: { code: "SW", latitudeDeg: -30, longitudeDeg: -70, fieldOfViewDeg2: 9.6, minAltitudeDeg: 25 },
  southSmall: { code: "SS", latitudeDeg: -31, longitudeDeg: 117, fieldOfViewDeg2: 0.5, minAltitudeDeg: 30 },
  southSlit: { code: "SP", latitudeDeg: -25, longitudeDeg: 20, fieldOfViewDeg2: 0.05, minAltitudeDeg: 30 },
  // From +70° a declination of −10° culminates at 90 − 80 = 10°: never above a 30° limit.
  farNorth: { code: "FN", latitudeDeg: 70, longitudeDeg: 20, fieldOfViewDeg2: 5, minAltitudeDeg: 30 },
};

beforeAll(async () => {
  env = await setupSkymapTest();
  shifter = await createCaller("shifter");
  observer = await createCaller("observer");
  const coordinator = await createCaller("coordinator");
  for (const s of Object.values(sites)) {
    const input = siteFormSchema.parse({ ...s, name: `Site ${s.code}`, elevationM: 1000, limitKind: "altitude", timeZone: "UTC" });
    await createSite(coordinator.user, input);
  }
  withMap = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 3_600_000) })).id;
  withoutMap = (await insertCandidate({ receivedAt: new Date(NOW.getTime() - 1_800_000) })).id;
  await uploadSkymap({ target: { candidateId: withMap }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-multiorder.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
});
afterAll(() => env.cleanup());

describe("visibility of a candidate's sky map from each site", () => {
  it("puts the sites that see most first, and none of the region for a site it never rises at", async () => {
    const visibility = await candidateVisibility(withMap, NOW);
    if (!visibility) throw new Error("expected visibility");
    const byCode = Object.fromEntries(visibility.rows.map((r) => [r.site.code, r]));
    const shares = visibility.rows.map((r) => r.observableProbability);
    expect(shares).toEqual([...shares].sort((a, b) => b - a));
    expect(byCode.FN?.observableProbability).toBe(0);
    expect(byCode.FN?.bestWindow).toBeNull();
    for (const code of ["SW", "SS", "SP"]) {
      const row = byCode[code];
      // In March the region (RA ≈ 8–10.5 h) is high in the evening sky of a southern site (common practice: the
      // anti-solar point is near RA 12 h at the equinox), so nearly all of it clears the limit at some time.
      expect(row?.observableProbability).toBeGreaterThan(0.8);
      expect(row?.regionProbability).toBeGreaterThan(0.88);
      expect(row?.regionProbability).toBeLessThan(0.95);
      const start = Date.parse(row?.nightStart ?? "");
      const end = Date.parse(row?.nightEnd ?? "");
      const window = row?.bestWindow;
      expect(window).not.toBeNull();
      expect(Date.parse(window?.start ?? "")).toBeGreaterThanOrEqual(start);
      expect(Date.parse(window?.end ?? "")).toBeLessThanOrEqual(end);
      expect(row?.moonIllumination).toBeGreaterThanOrEqual(0);
      expect(row?.moonIllumination).toBeLessThanOrEqual(1);
      expect(row?.moonSeparationDeg).toBeGreaterThanOrEqual(0);
      expect(row?.moonSeparationDeg).toBeLessThanOrEqual(180);
      // the sidereal sweep of a night of (end − start) hours: 360.98564736629°/day = 15.041°/h (Meeus 1998 Eq. 12.4)
      expect(row?.band?.lstSweepDeg).toBeCloseTo(((end - start) / 3_600_000) * 15.041, 1);
    }
  });

  it("answers null for a candidate without a sky map and 404 for an unknown one", async () => {
    expect(await candidateVisibility(withoutMap, NOW)).toBeNull();
    await expect(candidateVisibility("nope", NOW)).rejects.toMatchObject({ status: 404 });
    const res = await call(visibilityRoute.GET, { caller: observer, params: { id: withoutMap } });
    expect(res.status).toBe(200);
    expect(res.json.visibility).toBeNull();
  });
});

describe("suggested tasks for the planning dialog", () => {
  it("suggests the observing sites, best first, kind by field of view, window = best window", async () => {
    const { suggestions, skymapId } = await suggestTasks(withMap, NOW);
    if (process.env.SHOW_SUGGESTIONS) console.log(JSON.stringify(suggestions, null, 1));
    expect(skymapId).toBeTruthy();
    expect(suggestions.map((s) => s.siteCode).sort()).toEqual(["SP", "SS", "SW"]);
    const kinds = Object.fromEntries(suggestions.map((s) => [s.siteCode, s.kind]));
    expect(kinds).toEqual({ SW: "wide-field-tiling", SS: "galaxy-targeted", SP: "spectroscopy" });
    const visibility = await candidateVisibility(withMap, NOW);
    for (const s of suggestions) {
      const row = visibility?.rows.find((r) => r.site.id === s.siteId);
      expect(s.windowStart).toBe(row?.bestWindow?.start);
      expect(s.windowEnd).toBe(row?.bestWindow?.end);
      expect(s.notes).toMatch(/of the 90 % region rises above/);
    }
    expect(suggestions[0]?.priority).toBe(1);
    const tiling = suggestions.find((s) => s.kind === "wide-field-tiling");
    // ~1360 deg² × observable share / 9.6 deg² per pointing
    expect(tiling?.pointings).toBeGreaterThan(100);
    expect(tiling?.pointings).toBeLessThan(150);
  });

  it("suggests nothing without a sky map, and only to those who plan follow-up", async () => {
    expect(await suggestTasks(withoutMap, NOW)).toEqual({ skymapId: null, suggestions: [] });
    expect((await call(suggestionsRoute.GET, { caller: observer, params: { id: withMap } })).status).toBe(403);
    const none = await call(suggestionsRoute.GET, { caller: shifter, params: { id: withoutMap } });
    expect(none.status).toBe(200);
    expect(none.json.suggestions).toEqual([]);
  });

  it("breaks ties on the observable share by the share at one instant, then the sooner window, then the code", () => {
    const row = (code: string, observable: number, atOnce: number | null, start?: string) => ({
      site: { code },
      observableProbability: observable,
      bestWindow: atOnce === null ? null : { start: start ?? "2030-03-20T23:00:00.000Z", end: "2030-03-21T04:00:00.000Z", probabilityAboveLimit: atOnce },
    });
    const rows = [
      row("D", 0.6, 0.5, "2030-03-21T01:00:00.000Z"),
      row("C", 0.6, 0.5, "2030-03-20T22:00:00.000Z"),
      row("B", 0.6, 0.7),
      row("E", 0.6, 0.5, "2030-03-20T22:00:00.000Z"),
      row("Z", 0, null),
      row("A", 0.9, 0.2),
    ];
    expect([...rows].sort(compareVisibilityRows).map((r) => r.site.code)).toEqual(["A", "B", "C", "E", "D", "Z"]);
  });

  it("chooses kinds by field of view at the stated thresholds", () => {
    expect(taskKindForFieldOfView(0.01)).toBe("spectroscopy");
    expect(taskKindForFieldOfView(0.1)).toBe("galaxy-targeted");
    expect(taskKindForFieldOfView(0.99)).toBe("galaxy-targeted");
    expect(taskKindForFieldOfView(1)).toBe("wide-field-tiling");
  });
});

describe("tonight on the sites page", () => {
  it("lists recent candidates with sky maps and each site's share, and every site's coming night", async () => {
    const overview = await tonightOverview(NOW, { days: 3, limit: 10 });
    expect(overview.candidates.map((c) => c.id)).toEqual([withMap]);
    expect(overview.sites).toHaveLength(4);
    const cells = overview.candidates[0]?.cells ?? {};
    const farNorth = overview.sites.find((s) => s.site.code === "FN");
    expect(cells[farNorth?.site.id ?? ""]?.observableProbability).toBe(0);
    for (const s of overview.sites) expect(s.nightStart === null || Date.parse(s.nightStart) >= NOW.getTime() - 600_000).toBe(true);
    const later = await tonightOverview(new Date(NOW.getTime() + 5 * 86_400_000), { days: 3, limit: 10 });
    expect(later.candidates).toEqual([]);
  });
});
