import { gzipSync } from "node:zlib";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analyseSkymap, type SkymapErrorCode } from "@/lib/skymap";
import { fixtureBytes } from "./fixture-files";

function expectError(bytes: Uint8Array, code: SkymapErrorCode, message: RegExp, maxBytes?: number) {
  const result = analyseSkymap(bytes, maxBytes === undefined ? {} : { maxBytes });
  if (result.ok) throw new Error("expected a typed error, got a summary");
  expect(result.error.code).toBe(code);
  expect(result.error.message).toMatch(message);
  expect(result.error.toJSON()).toEqual({ code, message: result.error.message });
}

const bad = (name: string) => fixtureBytes(`malformed/${name}`);

describe("malformed files give typed errors naming the problem", () => {
  // Each file is written broken in one way by tests/fixtures/scripts/skymap_make_fixtures.py
  it.each<[string, SkymapErrorCode, RegExp]>([
    ["truncated-data.fits", "truncated", /HDU 1: data needs 12288 bytes .* file ends at byte 10000/],
    ["truncated-header.fits", "truncated", /primary HDU: file ends inside the header/],
    ["truncated.fits.gz", "bad-gzip", /gzip stream is truncated or corrupt/],
    ["wrong-first-card.fits", "not-fits", /^not a FITS file: first card is not SIMPLE$/],
    ["nans.fits", "non-finite", /^column PROB has 12 NaN values$/],
    ["negative.fits", "negative", /^negative probabilities: column PROB has 3 values below 0/],
    ["bad-ordering.fits", "bad-ordering", /^ORDERING must be RING, NESTED or NUNIQ, got SPIRAL$/],
    ["nside-mismatch.fits", "bad-nside", /NSIDE 32 implies 12288 pixels but column PROB holds 3072/],
    ["galactic.fits", "unsupported-layout", /COORDSYS G is not supported/],
    ["explicit-partial.fits", "unsupported-layout", /partial-sky flat maps \(INDXSCHM EXPLICIT\)/],
    ["all-zero.fits", "zero-total", /probabilities sum to zero/],
    ["multiorder-overlap.fits", "bad-uniq", /pixels overlap/],
  ])("%s → %s", (name, code, message) => expectError(bad(name), code, message));

  it("accepts the unbroken file they were made from", () => {
    const result = analyseSkymap(bad("good-n16.fits"));
    expect(result.ok && result.summary.nside).toBe(16);
  });

  it("refuses a file over the size limit, and a gzip that expands past it", () => {
    const good = bad("good-n16.fits");
    expectError(good, "too-large", /20160 bytes, over the 10000-byte limit/, 10_000);
    const bomb = gzipSync(new Uint8Array(5_000_000));
    expect(bomb.length).toBeLessThan(10_000);
    expectError(bomb, "too-large", /expands past the 1000000-byte limit/, 1_000_000);
  });

  it("refuses plain text and an empty upload as not FITS", () => {
    expectError(new TextEncoder().encode("hello, this is not a sky map"), "not-fits", /first card is not SIMPLE/);
    expectError(new Uint8Array(0), "not-fits", /first card is not SIMPLE/);
  });
});

describe("robustness", () => {
  const good = bad("good-n16.fits");

  it("never throws anything but a typed error on arbitrary bytes", () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 6000 }), (bytes) => {
        expect(analyseSkymap(bytes).ok).toBe(false);
      }),
      { numRuns: 200 },
    );
  });

  it("answers a summary or a typed error when header bytes of a good file are changed", () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 5759 }), fc.integer({ min: 0, max: 255 })), { minLength: 1, maxLength: 8 }),
        (edits) => {
          const bytes = good.slice();
          for (const [at, value] of edits) bytes[at] = value;
          const result = analyseSkymap(bytes);
          if (!result.ok) expect(result.error.name).toBe("SkymapError");
        },
      ),
      { numRuns: 300 },
    );
  });

  it("refuses every cut of a good file that loses header or data bytes", () => {
    const dataEnd = 2 * 2880 + 3072 * 4; // two header blocks, then 3072 float32 pixels
    for (let length = 0; length < dataEnd; length += 97) {
      const result = analyseSkymap(good.subarray(0, length));
      expect(result.ok ? "ok" : result.error.code).toMatch(/^(not-fits|truncated)$/);
    }
    // the final block's padding is not needed to read the data, so a cut inside it is tolerated
    expect(analyseSkymap(good.subarray(0, dataEnd)).ok).toBe(true);
  });
});
