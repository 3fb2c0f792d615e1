import { describe, expect, it } from "vitest";
import { loadSkymap } from "@/lib/skymap/load";
import { credibleDensityThreshold, credibleRegionPixels } from "@/lib/skymap/region-threshold";
import { fixtureBytes } from "./fixture-files";

const MAPS = ["bimodal-nested-n64.fits.gz", "bimodal-ring-n128.fits.gz", "bimodal-multiorder.fits.gz", "single-nested-n128.fits.gz"];

describe.each(MAPS)("credible region pixels of %s", (file) => {
  it.each([0.5, 0.9, 0.99])("level %s: exactly the pixels at or above the threshold, holding the level, kept per map", (level) => {
    const { map } = loadSkymap(fixtureBytes(file));
    const density = map.layout === "multiorder" ? map.densityPerSr : map.probability;
    const threshold = credibleDensityThreshold(map, level);
    const expected: number[] = [];
    density.forEach((d, i) => {
      if (d >= threshold && (map.probability[i] ?? 0) > 0) expected.push(i);
    });
    const region = credibleRegionPixels(map, level);
    expect(Array.from(region)).toEqual(expected);
    expect(expected.reduce((sum, i) => sum + (map.probability[i] ?? 0), 0)).toBeGreaterThanOrEqual(level);
    expect(credibleRegionPixels(map, level)).toBe(region);
    // another map object with the same numbers gets its own (equal) answer: nothing is shared between maps
    const copy = { ...map, probability: map.probability.slice() };
    expect(credibleRegionPixels(copy, level)).not.toBe(region);
    expect(Array.from(credibleRegionPixels(copy, level))).toEqual(expected);
  });
});
