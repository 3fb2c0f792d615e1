import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { uploadSkymap } from "@/lib/data/skymaps";
import { isoInZone } from "@/lib/format/time";
import { planCsvColumns } from "@/lib/plans/export";
import * as candidatePlansRoute from "@/app/api/v1/candidates/[id]/plans/route";
import * as exportRoute from "@/app/api/v1/plans/[id]/export/route";
import { fixtureBytes } from "../skymap/fixture-files";
import { call, createCaller, insertCandidate, setupSkymapTest, type Caller, type SkymapTestEnv } from "../skymap-api/helpers";
import { insertSiteWithInstrument, type PlanAnswer } from "./helpers";

let env: SkymapTestEnv;
let observer: Caller;
let plan: PlanAnswer;
const NOW = new Date(Date.UTC(2030, 2, 20, 12, 0, 0));

beforeAll(async () => {
  env = await setupSkymapTest();
  const shifter = await createCaller("shifter");
  observer = await createCaller("observer");
  // "Etc/GMT+4" is UTC−4 all year (POSIX sign convention), so the site-local offset is fixed: −04:00.
  const { instrument } = await insertSiteWithInstrument({ latitudeDeg: -30, longitudeDeg: -70, timeZone: "Etc/GMT+4", footprint: { shape: "circle", radiusDeg: 4 } });
  const candidate = (await insertCandidate({ receivedAt: NOW })).id;
  await uploadSkymap({ target: { candidateId: candidate }, fileName: "m.fits.gz", bytes: fixtureBytes("bimodal-nested-n64.fits.gz"), actorId: shifter.user.id, via: "ui", now: NOW });
  const res = await call(candidatePlansRoute.POST.with({ now: () => NOW.getTime() }), { caller: shifter, params: { id: candidate }, json: { instrumentId: instrument.id, maxPointings: 12 } });
  expect(res.status).toBe(201);
  plan = res.json as unknown as PlanAnswer;
});
afterAll(() => env.cleanup());

const download = (format?: string, id = plan.id) =>
  call(exportRoute.GET, { caller: observer, params: { id }, url: `http://localhost/api/v1/plans/${id}/export${format ? `?format=${format}` : ""}` });

/** RFC 4180 rows (our cells never hold quotes or commas, so a split is enough here). */
const rowsOf = (text: string) => text.trimEnd().split("\r\n").map((line) => line.split(","));

describe("GET /api/v1/plans/{id}/export", () => {
  it("CSV by default: our columns with units in the names, one row per pointing, UTC and site-local times", async () => {
    const { status, res } = await download();
    expect(status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="plan-PL\d+-2030-03-20-[0-9a-f]{8}\.csv"$/);
    const [header, ...rows] = rowsOf(await res.text());
    expect(header).toEqual([...planCsvColumns]);
    expect(rows).toHaveLength(plan.pointings.length);
    const col = (name: (typeof planCsvColumns)[number]) => planCsvColumns.indexOf(name);
    plan.pointings.forEach((p, k) => {
      const row = rows[k] ?? [];
      expect(Number(row[col("pointing")])).toBe(p.index);
      expect(Number(row[col("ra_deg")])).toBeCloseTo(p.raDeg, 5);
      expect(Number(row[col("dec_deg")])).toBeCloseTo(p.decDeg, 5);
      expect(Number(row[col("cumulative_probability")])).toBeCloseTo(p.cumulativeProbability, 6);
      expect(row[col("start_utc")]).toBe(p.plannedStart ?? "");
      expect(row[col("not_scheduled_because")]).toBe(p.unscheduledReason ?? "");
      if (p.plannedStart) {
        const local = row[col("start_site_local")] ?? "";
        expect(local).toMatch(/-04:00$/);
        expect(Date.parse(local)).toBe(Math.floor(Date.parse(p.plannedStart) / 1000) * 1000);
        expect(Number(row[col("altitude_deg")])).toBeCloseTo(p.altitudeDeg ?? NaN, 2);
        expect(Number(row[col("moon_distance_deg")])).toBeCloseTo(p.moonSeparationDeg ?? NaN, 2);
      } else {
        expect(row[col("start_site_local")]).toBe("");
      }
      expect(row[col("exposure_s")]).toBe("300");
      expect(row[col("filter")]).toBe("g");
    });
  });

  it("JSON: the plan's header with its caution, then the same rows", async () => {
    const { status, res } = await download("json");
    expect(status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^application\/json/);
    const body = JSON.parse(await res.text()) as { plan: Record<string, unknown> & { window: Record<string, string> }; pointings: Array<Record<string, unknown>> };
    expect(body.plan.id).toBe(plan.id);
    expect(body.plan.caution).toMatch(/rapid triage estimates/i);
    expect(body.plan.window.startUtc).toBe(plan.window.start);
    expect(body.plan.window.startSiteLocal).toBe("2030-03-20T08:00:00-04:00");
    expect(body.pointings.map((p) => p.pointing)).toEqual(plan.pointings.map((p) => p.index));
    expect(body.pointings.map((p) => p.startUtc)).toEqual(plan.pointings.map((p) => p.plannedStart));
  });

  it("refuses an unknown format (422 naming format) and an unknown plan (404)", async () => {
    const bad = await download("xml");
    expect(bad.status).toBe(422);
    expect((bad.json.issues as Array<{ path: string }>).map((i) => i.path)).toContain("format");
    expect((await download("csv", "no-such-plan")).status).toBe(404);
  });
});

describe("isoInZone", () => {
  it("writes the zone's offset at that instant, Z for UTC", () => {
    const t = Date.UTC(2030, 0, 15, 3, 4, 5, 678);
    expect(isoInZone(t, "UTC")).toBe("2030-01-15T03:04:05Z");
    expect(isoInZone(t, "Etc/GMT+4")).toBe("2030-01-14T23:04:05-04:00");
    expect(isoInZone(t, "Etc/GMT-13")).toBe("2030-01-15T16:04:05+13:00");
    expect(isoInZone(t, "Asia/Kolkata")).toBe("2030-01-15T08:34:05+05:30"); // IST is UTC+5:30 (no daylight saving)
    expect(isoInZone(t, "No/Such_Zone")).toBe("2030-01-15T03:04:05Z");
  });
});
