import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as feedSkymap } from "@/app/api/v1/feed/candidates/[source]/[externalId]/skymap/route";
import { multipartFile } from "@/fakes/feed/poster";
import { signFeedBody } from "@/lib/feed/signature";
import { analyseSkymap } from "@/lib/skymap";
import { relativeDifference, separationDeg } from "../skymap/fixture-files";
import { call, insertCandidate, setupSkymapTest, type SkymapTestEnv } from "./helpers";

// Reference figures: healpy + numpy on Debian, tests/fixtures/scripts/feed_demo_skymaps.py (writes the maps too)
const DIR = fileURLToPath(new URL("../../fakes/feed/skymaps/", import.meta.url));
interface DemoReference {
  nside: number;
  layout: string;
  pixelCount: number;
  area50Deg2: number;
  area90Deg2: number;
  peak: { raDeg: number; decDeg: number };
}
const reference = JSON.parse(readFileSync(path.join(DIR, "reference.json"), "utf8")) as { maps: Record<string, DemoReference> };
const bytesOf = (name: string) => new Uint8Array(readFileSync(path.join(DIR, name)));

describe("the fake feed's demo sky maps", () => {
  it("are four small gzip FITS files of nside 64–128, each with its healpy figures", () => {
    const files = readdirSync(DIR).filter((n) => n.endsWith(".fits.gz")).sort();
    expect(files).toHaveLength(4);
    expect(Object.keys(reference.maps).sort()).toEqual(files);
    for (const name of files) {
      expect(statSync(path.join(DIR, name)).size, name).toBeLessThan(200 * 1024);
      expect([...bytesOf(name).subarray(0, 2)]).toEqual([0x1f, 0x8b]);
      expect([64, 128]).toContain(reference.maps[name]?.nside);
    }
  });

  it("are distinct: their 90 % areas differ by at least a factor 1.5 from one to the next", () => {
    const areas = Object.values(reference.maps).map((m) => m.area90Deg2).sort((a, b) => a - b);
    for (let i = 1; i < areas.length; i++) expect((areas[i] ?? 0) / (areas[i - 1] ?? 1)).toBeGreaterThan(1.5);
  });

  describe.each(Object.entries(reference.maps))("%s read by lib/skymap", (name, expected) => {
    it("gives healpy's layout, nside, 50 % and 90 % areas (within 1 %) and peak pixel", () => {
      const result = analyseSkymap(bytesOf(name));
      if (!result.ok) throw new Error(result.error.message);
      const { summary } = result;
      expect(summary.layout).toBe(expected.layout);
      expect(summary.nside).toBe(expected.nside);
      expect(summary.pixelCount).toBe(expected.pixelCount);
      expect(relativeDifference(summary.area50Deg2, expected.area50Deg2)).toBeLessThan(0.01);
      expect(relativeDifference(summary.area90Deg2, expected.area90Deg2)).toBeLessThan(0.01);
      expect(separationDeg(summary.peak, expected.peak)).toBeLessThan(1e-6);
    });
  });
});

describe("the fake feed's sky-map post", () => {
  let env: SkymapTestEnv;
  const SECRET = "d".repeat(40);
  const NOW_MS = Date.UTC(2030, 2, 20, 12, 0, 0);
  const route = feedSkymap.with({ now: () => NOW_MS, feedSecret: () => SECRET });

  beforeAll(async () => {
    env = await setupSkymapTest();
  });
  afterAll(() => env.cleanup());

  it("is a multipart body the feed's sky-map route accepts when signed over its bytes, answering healpy's 90 % area", async () => {
    const candidate = await insertCandidate();
    const name = "demo-arc-n64.fits.gz";
    const { body, contentType } = await multipartFile(name, bytesOf(name));
    const headers = { "content-type": contentType, ...signFeedBody(SECRET, body, NOW_MS) };
    const res = await call(route, { params: { source: candidate.source, externalId: candidate.externalId }, body, headers });
    expect(res.status, JSON.stringify(res.json)).toBe(201);
    expect(relativeDifference(Number(res.json.area90Deg2), reference.maps[name]?.area90Deg2 ?? 0)).toBeLessThan(0.01);
  });
});
