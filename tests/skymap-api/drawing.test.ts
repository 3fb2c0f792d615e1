import { ang2pix_nest } from "@hscmap/healpix";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { altitudeOfDateDeg, localSiderealTimeDeg } from "@/lib/astro";
import { raDecToNest } from "@/components/skymap/healpix-lookup";
import { hourAngleAboveLimitDeg, nightBandContains } from "@/components/skymap/night-band";
import { projectView } from "@/components/skymap/projection";

describe("the canvas's HEALPix lookup", () => {
  it("agrees with @hscmap/healpix's ang2pix_nest everywhere (random directions, nside 1 … 256)", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 8 }),
        fc.oneof(fc.double({ min: 0, max: 359.99, noNaN: true }), fc.integer({ min: 0, max: 71 }).map((k) => k * 5)),
        fc.oneof(fc.double({ min: -89.99, max: 89.99, noNaN: true }), fc.integer({ min: -17, max: 17 }).map((k) => k * 5)),
        (order, raDeg, decDeg) => {
          const nside = 2 ** order;
          const theirs = (ra: number, dec: number) => ang2pix_nest(nside, ((90 - dec) * Math.PI) / 180, (ra * Math.PI) / 180);
          if (raDecToNest(nside, raDeg, decDeg) === theirs(raDeg, decDeg)) return;
          // the two may break a tie differently exactly on a pixel boundary; a hair away they must agree
          const [ra, dec] = [raDeg + 1e-7, Math.max(-90, Math.min(90, decDeg + 1e-7))];
          expect(raDecToNest(nside, ra, dec)).toBe(theirs(ra, dec));
        },
      ),
      { numRuns: 3000 },
    );
  });
});

describe("a site's night-time band", () => {
  it("matches a brute-force altitude scan through the night (altitudes from lib/astro on astronomy-engine)", () => {
    // A fictional site and night: 30° S, limit 25°, night of 9 h from 2030-03-20 23:00 UTC.
    const site = { latDeg: -30, lonDeg: -70, elevationM: 0 };
    const start = new Date(Date.UTC(2030, 2, 20, 23, 0, 0));
    const hours = 9;
    const band = {
      latDeg: site.latDeg,
      minAltitudeDeg: 25,
      lstStartDeg: localSiderealTimeDeg(start, site.lonDeg),
      lstSweepDeg: hours * 15.0410686,
    };
    let disagreements = 0;
    let samples = 0;
    for (let dec = -88; dec <= 88; dec += 8) {
      for (let ra = 0; ra < 360; ra += 10) {
        let highest = -90;
        for (let m = 0; m <= hours * 60; m += 2) {
          highest = Math.max(highest, altitudeOfDateDeg({ raDeg: ra, decDeg: dec }, site, new Date(start.getTime() + m * 60_000)));
        }
        samples += 1;
        // within 0.3° of the limit the 2-minute scan and the closed form may differ
        if (Math.abs(highest - 25) > 0.3 && nightBandContains(band, ra, dec) !== highest >= 25) disagreements += 1;
      }
    }
    expect(samples).toBeGreaterThan(700);
    expect(disagreements).toBe(0);
  });

  it("has the textbook extremes: a declination never above the limit, and one always above it", () => {
    // from 30° S a star at +70° culminates at 90 − 100 < 0; the south celestial pole stands at 30°
    expect(hourAngleAboveLimitDeg(-30, 25, 70)).toBe(-1);
    expect(hourAngleAboveLimitDeg(-30, 25, -89.9)).toBe(180);
    expect(hourAngleAboveLimitDeg(0, 0, 0)).toBeCloseTo(90, 9);
  });
});

describe("the all-sky view", () => {
  it("puts RA 12 h in the middle and increasing RA to the left (common practice for sky maps)", () => {
    const view = projectView({ kind: "all-sky" }, 800, 400);
    const centre = view.place(180, 0);
    const east = view.place(210, 0);
    const west = view.place(150, 0);
    expect(centre?.[0]).toBeCloseTo(400, 6);
    expect(east && centre && east[0] < centre[0]).toBe(true);
    expect(west && centre && west[0] > centre[0]).toBe(true);
    const back = view.skyAt(300, 150);
    const again = back ? view.place(back[0], back[1]) : null;
    expect(again?.[0]).toBeCloseTo(300, 6);
    expect(again?.[1]).toBeCloseTo(150, 6);
    expect(view.skyAt(2, 2)).toBeNull(); // outside the ellipse
  });
});
