import { readFileSync } from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { describe, expect, it } from "vitest";
import { headerString, isGzip, readFits } from "@/lib/skymap/fits";
import { binTables, findColumn, readNumericColumn } from "@/lib/skymap/fits-table";
import { FIXTURE_DIR, fixtureBytes } from "./fixture-files";

// Expected values: astropy.io.fits reading the same file (tests/fixtures/scripts/skymap_make_fixtures.py)
const expected = JSON.parse(readFileSync(path.join(FIXTURE_DIR, "column-types.json"), "utf8")) as {
  columns: Record<string, Array<number | null>>;
  header: { OBJECT: string; EXPO: number; FLAGKEY: boolean; NAXIS1: number };
};

describe("readFits on a table with every numeric TFORM type", () => {
  const file = readFits(fixtureBytes("column-types.fits"));
  const table = binTables(file)[0];
  if (!table) throw new Error("fixture has no BINTABLE");

  it("parses quoted strings with doubled quotes, reals and logicals (FITS 4.0 §4.2)", () => {
    expect(headerString(table.hdu.header, "OBJECT")).toBe(expected.header.OBJECT);
    expect(table.hdu.header.get("EXPO")).toBe(expected.header.EXPO);
    expect(table.hdu.header.get("FLAGKEY")).toBe(expected.header.FLAGKEY);
    expect(table.rowBytes).toBe(expected.header.NAXIS1);
    expect(file.gzipped).toBe(false);
    expect(file.hdus.map((h) => h.kind)).toEqual(["PRIMARY", "BINTABLE"]);
  });

  it.each(Object.keys(expected.columns))("decodes column %s as astropy does", (name) => {
    const column = findColumn(table, name);
    if (!column) throw new Error(`no column ${name}`);
    const values = Array.from(readNumericColumn(file, table, column)).map((v) => (Number.isNaN(v) ? null : v));
    expect(values).toEqual(expected.columns[name]);
  });

  it("refuses to read a character column as numbers", () => {
    const column = findColumn(table, "NAME");
    if (!column) throw new Error("no NAME column");
    expect(() => readNumericColumn(file, table, column)).toThrow(/TFORM type A/);
  });

  it("reads the same file after gzip", () => {
    const gz = gzipSync(fixtureBytes("column-types.fits"));
    expect(isGzip(gz)).toBe(true);
    const again = readFits(gz);
    expect(again.gzipped).toBe(true);
    expect(again.bytes).toEqual(file.bytes);
  });
});
