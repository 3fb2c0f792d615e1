import { describe, expect, it } from "vitest";
import { contrastRatio, rampColour, relativeLuminance, skyPalettes, skyThemeOf, type SkyTheme } from "@/components/skymap/palette";
import { contourMarks } from "@/components/skymap/raster";

// Thresholds from WCAG 2.1: 3:1 for graphical objects (SC 1.4.11), contrast ratio and relative luminance as defined there.
describe.each(["light", "dark"] as SkyTheme[])("the %s sky palette", (theme) => {
  const palette = skyPalettes[theme];
  const steps = Array.from({ length: 21 }, (_, i) => rampColour(palette, i / 20));

  it("moves away from the background in lightness as probability rises, so order reads without hue", () => {
    const distance = steps.map((c) => Math.abs(relativeLuminance(c) - relativeLuminance(palette.background)));
    for (let i = 1; i < distance.length; i++) expect(distance[i]).toBeGreaterThan(distance[i - 1] as number);
  });

  it("draws its peak at least 3:1 against the background", () => {
    expect(contrastRatio(steps[20] as (typeof steps)[number], palette.background)).toBeGreaterThanOrEqual(3);
  });

  it("draws contours at least 3:1 against the background and against the casing", () => {
    expect(contrastRatio(palette.contour, palette.background)).toBeGreaterThanOrEqual(3);
    expect(contrastRatio(palette.contour, palette.casing)).toBeGreaterThanOrEqual(3);
  });

  it("is not a dark-to-yellow ramp: no stop is yellow (red and green high, blue low)", () => {
    for (const [, [r, g, b]] of palette.ramp) expect(r > 180 && g > 180 && b < 120).toBe(false);
  });
});

describe("skyThemeOf", () => {
  it("takes light only when the resolved theme is light", () => {
    expect(skyThemeOf("light")).toBe("light");
    expect(skyThemeOf("dark")).toBe("dark");
    expect(skyThemeOf(undefined)).toBe("dark");
  });
});

describe("contour marks", () => {
  // A 6×1 strip: levels 50 % | 50 % | 90 % | 90 % | outside | outside (classes 0, 0, 1, 1, 2, 2).
  const levels = Int8Array.from([0, 0, 1, 1, 2, 2]);

  it("makes the 50 % line two pixels wide and the 90 % line one", () => {
    expect(Array.from(contourMarks(levels, 6, 1))).toEqual([0, 2, 2, 1, 0, 0]);
  });

  it("leaves pixels off the sky unmarked", () => {
    expect(Array.from(contourMarks(Int8Array.from([-1, -1, 0, 0]), 4, 1))).toEqual([0, 0, 0, 0]);
  });
});
