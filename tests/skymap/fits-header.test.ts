import { describe, expect, it } from "vitest";
import { analyseSkymap } from "@/lib/skymap";
import { readFits } from "@/lib/skymap/fits";

/** Cards padded to 80 characters and blocks to 2880 bytes, as FITS 4.0 §3.3 and §4.1 lay them out. */
function headerBlock(cards: string[]): Uint8Array {
  const text = [...cards, "END"].map((card) => card.padEnd(80, " ")).join("");
  const padded = text.padEnd(Math.ceil(text.length / 2880) * 2880, " ");
  return new TextEncoder().encode(padded);
}

describe("header cards (FITS 4.0 §4.2)", () => {
  const card = (key: string, value: string, comment = "") => `${key.padEnd(8)}= ${value.padStart(20)}${comment ? ` / ${comment}` : ""}`;
  const bytes = headerBlock([
    card("SIMPLE", "T", "conforms"),
    card("BITPIX", "8"),
    card("NAXIS", "0"),
    card("EXPD", "1.5D3", "Fortran double exponent"),
    card("EXPE", "-2.5E-2"),
    `${"QUOTED".padEnd(8)}= 'it''s a / slash'    / comment with 'quotes'`,
    card("FLAG", "F"),
    "COMMENT   = this commentary card is not a value",
    "HISTORY written by hand",
    "",
    card("EXPD", "99", "a repeated keyword: the first one wins"),
  ]);

  it("reads logicals, integers, D and E exponents and quoted strings with doubled quotes", () => {
    const { header } = readFits(bytes).hdus[0] ?? { header: new Map() };
    expect(header.get("SIMPLE")).toBe(true);
    expect(header.get("NAXIS")).toBe(0);
    expect(header.get("EXPD")).toBe(1500);
    expect(header.get("EXPE")).toBe(-0.025);
    expect(header.get("QUOTED")).toBe("it's a / slash");
    expect(header.get("FLAG")).toBe(false);
    expect(header.has("COMMENT")).toBe(false);
  });

  it("answers no-table for a file with only a primary HDU", () => {
    const result = analyseSkymap(bytes);
    expect(result.ok ? "ok" : result.error.code).toBe("no-table");
  });

  it("refuses a non-ASCII byte in a header card", () => {
    const broken = bytes.slice();
    broken[200] = 0xe9;
    const result = analyseSkymap(broken);
    expect(result.ok ? "" : result.error.message).toMatch(/non-ASCII byte 0xe9/);
  });

  it("refuses SIMPLE = F and a header without END", () => {
    const notSimple = headerBlock([card("SIMPLE", "F"), card("BITPIX", "8"), card("NAXIS", "0")]);
    const simpleResult = analyseSkymap(notSimple);
    expect(simpleResult.ok ? "" : simpleResult.error.message).toBe("not a FITS file: SIMPLE is not T");
    const noEnd = new TextEncoder().encode(card("SIMPLE", "T").padEnd(2880, " "));
    const result = analyseSkymap(noEnd);
    expect(result.ok ? "" : result.error.code).toBe("truncated");
  });
});
