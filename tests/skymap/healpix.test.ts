import * as reference from "@hscmap/healpix";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { forEachPixelInDisc } from "@/lib/skymap/disc";
import { decodeUniq, nestCentreVec, nsideToOrder, raDecToVec, ringToNest, vecToRaDec } from "@/lib/skymap/healpix";

// Reference implementation: the @hscmap/healpix package (Górski et al. 2005, ApJ 622, 759)

describe("ringToNest", () => {
  it("matches @hscmap/healpix ring2nest for every pixel up to nside 64", () => {
    for (const nside of [1, 2, 4, 8, 16, 32, 64]) {
      for (let pix = 0; pix < 12 * nside * nside; pix++) {
        if (ringToNest(nside, pix) !== reference.ring2nest(nside, pix)) {
          throw new Error(`nside ${nside} pixel ${pix}: ${ringToNest(nside, pix)} vs ${reference.ring2nest(nside, pix)}`);
        }
      }
    }
  });

  it("matches it on random pixels up to nside 8192", () => {
    fc.assert(
      fc.property(fc.integer({ min: 7, max: 13 }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (order, u) => {
        const nside = 2 ** order;
        const pix = Math.floor(u * 12 * nside * nside);
        expect(ringToNest(nside, pix)).toBe(reference.ring2nest(nside, pix));
      }),
      { numRuns: 500 },
    );
  });
});

describe("NUNIQ decoding (uniq = 4·4^order + ipix)", () => {
  it("inverts the packing for every order up to 24", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 24 }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (order, u) => {
        const ipix = Math.floor(u * 12 * 4 ** order);
        expect(decodeUniq(4 * 4 ** order + ipix)).toEqual({ order, ipix });
      }),
    );
  });

  it("decodes the first and last pixels of an order and refuses non-indices", () => {
    expect(decodeUniq(4)).toEqual({ order: 0, ipix: 0 });
    expect(decodeUniq(15)).toEqual({ order: 0, ipix: 11 });
    expect(decodeUniq(16)).toEqual({ order: 1, ipix: 0 });
    expect(decodeUniq(3)).toBeUndefined();
    expect(decodeUniq(4.5)).toBeUndefined();
    expect(decodeUniq(4 * 4 ** 25)).toBeUndefined();
  });
});

describe("nestCentreVec", () => {
  it("matches pix2vec_nest where @hscmap/healpix reaches (order ≤ 13)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 13 }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (order, u) => {
        const ipix = Math.floor(u * 12 * 4 ** order);
        const [x, y, z] = nestCentreVec(order, ipix);
        const [rx, ry, rz] = reference.pix2vec_nest(2 ** order, ipix);
        expect(Math.hypot(x - rx, y - ry, z - rz)).toBeLessThan(1e-12);
      }),
      { numRuns: 500 },
    );
  });

  it("places a fine pixel's centre inside its order-12 parent (orders 13–24)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 13, max: 24 }), fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true }), (order, u) => {
        const ipix = Math.floor(u * 12 * 4 ** order);
        const parent = Math.floor(ipix / 4 ** (order - 12));
        expect(reference.vec2pix_nest(2 ** 12, nestCentreVec(order, ipix))).toBe(parent);
      }),
      { numRuns: 500 },
    );
  });
});

describe("forEachPixelInDisc", () => {
  it("visits exactly the pixels whose centres lie in the disc (brute force over all pixels)", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(1, 2, 4, 8, 16),
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: -90, max: 90, noNaN: true }),
        fc.double({ min: 0, max: 180, noNaN: true }),
        (nside, ra, dec, radiusDeg) => {
          const centre = raDecToVec(ra, dec);
          const cosRadius = Math.cos((radiusDeg * Math.PI) / 180);
          const visited: number[] = [];
          forEachPixelInDisc(nside, centre, cosRadius, (p) => visited.push(p));
          const expected: number[] = [];
          for (let p = 0; p < 12 * nside * nside; p++) {
            const [x, y, z] = reference.pix2vec_ring(nside, p);
            const dot = x * centre[0] + y * centre[1] + z * centre[2];
            // centres within 1e-12 of the edge may fall either way; leave them out of the comparison
            if (Math.abs(dot - cosRadius) < 1e-12) continue;
            if (dot >= cosRadius) expected.push(p);
          }
          const got = visited.filter((p) => {
            const [x, y, z] = reference.pix2vec_ring(nside, p);
            return Math.abs(x * centre[0] + y * centre[1] + z * centre[2] - cosRadius) >= 1e-12;
          });
          expect(new Set(got).size).toBe(got.length);
          expect(got.sort((a, b) => a - b)).toEqual(expected);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("handles a disc centred on a pole", () => {
    const visited: number[] = [];
    forEachPixelInDisc(4, [0, 0, 1], Math.cos((40 * Math.PI) / 180), (p) => visited.push(p));
    const expected = Array.from({ length: 192 }, (_, p) => p).filter((p) => reference.pix2vec_ring(4, p)[2] >= Math.cos((40 * Math.PI) / 180));
    expect(visited.sort((a, b) => a - b)).toEqual(expected);
  });
});

describe("small helpers", () => {
  it("recognises power-of-two nsides only", () => {
    expect(nsideToOrder(1)).toBe(0);
    expect(nsideToOrder(512)).toBe(9);
    expect(nsideToOrder(12)).toBeUndefined();
    expect(nsideToOrder(0)).toBeUndefined();
    expect(nsideToOrder(2 ** 25)).toBeUndefined();
  });

  it("round-trips positions through unit vectors", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 359.999, noNaN: true }), fc.double({ min: -89.9, max: 89.9, noNaN: true }), (ra, dec) => {
        const back = vecToRaDec(raDecToVec(ra, dec));
        expect(back.raDeg).toBeCloseTo(ra, 9);
        expect(back.decDeg).toBeCloseTo(dec, 9);
      }),
    );
  });
});
