import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { analyseSkymap, pixelLocator } from "@/lib/skymap";

// Reference indices: tests/fixtures/scripts/pixel_at_make_fixture.py (healpy.ang2pix; for multi-order maps, the row
// whose NUNIQ matches ang2pix at one of the map's orders), a different method from the locator's range search.
const fixtures = new URL("../fixtures/", import.meta.url);
const reference = JSON.parse(readFileSync(new URL("galaxies/pixel-at.json", fixtures), "utf8")) as {
  raDeg: number[];
  decDeg: number[];
} & Record<"flatNested" | "flatRing" | "multiorder", { file: string; index: number[] }>;

describe("pixel locator against healpy", () => {
  for (const key of ["flatNested", "flatRing", "multiorder"] as const) {
    it(`${key}: ${reference[key].file}`, () => {
      const result = analyseSkymap(new Uint8Array(readFileSync(new URL(reference[key].file, fixtures))));
      if (!result.ok) throw result.error;
      const locate = pixelLocator(result.map);
      const found = reference.raDeg.map((ra, i) => locate(ra, reference.decDeg[i] ?? 0));
      expect(found).toEqual(reference[key].index);
    });
  }
});
