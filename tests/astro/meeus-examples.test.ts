import { describe, expect, it } from "vitest";
import {
  equatorialToHorizontal,
  greenwichMeanSiderealTimeDeg,
  julianDay,
  moonApparent,
  moonIlluminatedFraction,
  sunApparent,
} from "@/lib/astro";

// Worked examples of Meeus, Astronomical Algorithms 2nd ed. (1998). The expected figures are quoted
// from memory of the book; the astropy comparisons in astropy-reference.test.ts check the same code
// independently (precession is checked only there: Example 21.b mixes in proper motion that could
// not be reproduced from memory with confidence).

describe("Meeus worked examples", () => {
  it("Example 7.a: 1957 October 4.81 is JD 2436116.31", () => {
    const date = new Date(Date.UTC(1957, 9, 4) + 0.81 * 86_400_000);
    expect(julianDay(date)).toBeCloseTo(2436116.31, 6);
  });

  it("Example 12.a/12.b: mean sidereal time at Greenwich on 1987 April 10", () => {
    const hms = (h: number, m: number, s: number) => 15 * (h + m / 60 + s / 3600);
    expect(greenwichMeanSiderealTimeDeg(2446895.5)).toBeCloseTo(hms(13, 10, 46.3668), 5);
    const evening = julianDay(new Date(Date.UTC(1987, 3, 10, 19, 21, 0)));
    expect(greenwichMeanSiderealTimeDeg(evening)).toBeCloseTo(hms(8, 34, 57.0896), 5);
  });

  it("Example 13.b: altitude and azimuth of a planet seen from 38°55′17″ N", () => {
    const { altDeg, azDeg } = equatorialToHorizontal(64.352133, -(6 + 43 / 60 + 11.61 / 3600), 38 + 55 / 60 + 17 / 3600);
    expect(altDeg).toBeCloseTo(15.1249, 3);
    expect(azDeg).toBeCloseTo(68.0337 + 180, 3); // Meeus counts azimuth from the south
  });

  it("Example 25.a: the Sun on 1992 October 13.0 TD", () => {
    const sun = sunApparent(2448908.5);
    expect(sun.raDeg).toBeCloseTo(198.38083, 4);
    expect(sun.decDeg).toBeCloseTo(-7.78507, 4);
    expect(sun.distanceKm / 149_597_870.7).toBeCloseTo(0.99766, 5);
  });

  it("Example 47.a: the Moon on 1992 April 12.0 TD", () => {
    const moon = moonApparent(2448724.5);
    // λ differs from the book's 133.167265° by the low-precision nutation (ch. 22, ±0.5″)
    expect(moon.longitudeDeg).toBeCloseTo(133.167265, 3);
    expect(moon.latitudeDeg).toBeCloseTo(-3.229126, 6);
    expect(moon.distanceKm).toBeCloseTo(368409.7, 1);
    expect(moon.raDeg).toBeCloseTo(134.68847, 3);
    expect(moon.decDeg).toBeCloseTo(13.768368, 3);
  });

  it("Example 48.a: illuminated fraction 0.6786 on 1992 April 12.0 TD", () => {
    expect(moonIlluminatedFraction(2448724.5)).toBeCloseTo(0.6786, 3);
  });
});
