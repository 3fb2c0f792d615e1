import { describe, expect, it } from "vitest";
import { angularSeparationDeg, greenwichSiderealTimeDeg, julianDay, moonApparent, moonIlluminatedFraction, sunApparent } from "@/lib/astro";

// Worked examples of Meeus, Astronomical Algorithms 2nd ed. (1998), as a second, independent check of
// the astronomy-engine positions behind lib/astro. The expected figures are quoted from memory of the
// book; Meeus's own methods there are good to about 10″ (Moon) and 0.01° (Sun, low accuracy), so the
// tolerances are those, not the library's. TD = UTC + 69.184 s is close enough here (< 1″ for the Sun).

const TD_MINUS_UTC_MS = 69_184;
const fromJde = (jde: number) => new Date((jde - 2_440_587.5) * 86_400_000 - TD_MINUS_UTC_MS);

describe("Meeus worked examples", () => {
  it("Example 7.a: 1957 October 4.81 is JD 2436116.31", () => {
    const date = new Date(Date.UTC(1957, 9, 4) + 0.81 * 86_400_000);
    expect(julianDay(date)).toBeCloseTo(2436116.31, 6);
  });

  it("Example 12.b: apparent sidereal time at Greenwich on 1987 April 10, 19:21 UT (8h34m56.853s)", () => {
    const hms = (h: number, m: number, s: number) => 15 * (h + m / 60 + s / 3600);
    // astronomy-engine counts UT as UTC; in 1987 UT1 − UTC was under 1 s (≤ 0.004°)
    expect(Math.abs(greenwichSiderealTimeDeg(new Date(Date.UTC(1987, 3, 10, 19, 21, 0))) - hms(8, 34, 56.853))).toBeLessThan(0.005);
  });

  it("Example 25.b: the Sun on 1992 October 13.0 TD (α 198.37817°, δ −7.78387°)", () => {
    const sun = sunApparent(fromJde(2448908.5));
    expect(angularSeparationDeg(sun, { raDeg: 198.378178, decDeg: -7.783871 })).toBeLessThan(0.002);
    expect(Math.abs(sun.distanceKm / 149_597_870.7 - 0.99760775)).toBeLessThan(1e-5); // R of the VSOP87 example
  });

  it("Example 47.a: the Moon on 1992 April 12.0 TD", () => {
    const moon = moonApparent(fromJde(2448724.5));
    expect(angularSeparationDeg(moon, { raDeg: 134.688470, decDeg: 13.768368 })).toBeLessThan(15 / 3600);
    expect(Math.abs(moon.distanceKm - 368409.7)).toBeLessThan(20);
  });

  it("Example 48.a: illuminated fraction 0.6786 on 1992 April 12.0 TD", () => {
    expect(moonIlluminatedFraction(fromJde(2448724.5))).toBeCloseTo(0.6786, 2);
  });
});
