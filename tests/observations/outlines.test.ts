import { geoArea } from "d3-geo";
import { describe, expect, it } from "vitest";
import { outlinePolygon } from "@/components/skymap/outlines";
import { footprintOutline } from "@/lib/skymap/footprint";
import { footprintAreaDeg2 } from "@/lib/validations/instruments";

const SR_TO_DEG2 = (180 / Math.PI) ** 2;

describe("observed footprints are drawn as the small region, whichever way their ring runs", () => {
  // A gnomonic rectangle has great-circle edges, as d3's polygons do, so its drawn area is the exact solid angle
  // 4·asin(sin(w/2)·sin(h/2)) (footprintAreaDeg2); a 72-point circle is a shade under 2π(1 − cos r).
  it.each([
    [{ shape: "rectangle", widthDeg: 3, heightDeg: 2 } as const, 10, -35, 1e-9],
    [{ shape: "rectangle", widthDeg: 8, heightDeg: 8 } as const, 359, 10, 1e-9],
    [{ shape: "rectangle", widthDeg: 2, heightDeg: 2 } as const, 180, 89, 1e-9],
    [{ shape: "circle", radiusDeg: 1.5 } as const, 123.4, -60, 2e-3],
  ])("%o at (%d°, %d°)", (footprint, ra, dec, tolerance) => {
    const ring = footprintOutline(footprint, ra, dec, 72).map((p) => [p.raDeg, p.decDeg] as const);
    const expected = footprintAreaDeg2(footprint);
    for (const r of [ring, [...ring].reverse()]) {
      const drawn = geoArea(outlinePolygon({ ring: r })) * SR_TO_DEG2;
      expect(Math.abs(drawn - expected) / expected).toBeLessThan(tolerance);
    }
  });
});
