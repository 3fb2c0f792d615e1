import { describe, expect, it } from "vitest";
import { checkObservationRows, observationsBodySchema } from "@/lib/validations/observations";
import { parseObservationCsv } from "@/lib/validations/observations-csv";

const now = new Date("2026-12-04T06:00:00Z");
const good = { raDeg: 123.4, decDeg: -35, startTime: "2026-12-04T05:00:00Z", exposureS: 120, filter: "r" };

describe("checkObservationRows", () => {
  it("accepts good rows, with optional fields", () => {
    const check = checkObservationRows([good, { ...good, footprint: { shape: "circle", radiusDeg: 1 }, pointingIndex: 3, limitingMagnitude: 21.5 }], now);
    expect(check.ok && check.rows.length).toBe(2);
  });

  it.each([
    [{ ...good, raDeg: 360 }, "raDeg"],
    [{ ...good, decDeg: -90.01 }, "decDeg"],
    [{ ...good, exposureS: 0 }, "exposureS"],
    [{ ...good, exposureS: 86_401 }, "exposureS"],
    [{ ...good, startTime: "yesterday" }, "startTime"],
    [{ ...good, startTime: "2026-12-04T07:00:01Z" }, "startTime"],
    [{ ...good, filter: "" }, "filter"],
    [{ ...good, colour: "red" }, "colour"],
  ])("names the row and the field of a bad row (%o → %s)", (bad, field) => {
    const check = checkObservationRows([good, good, bad], now);
    expect(check).toMatchObject({ ok: false, problem: { row: 3, field } });
  });

  it("takes a start exactly 1 h ahead of the clock", () => {
    expect(checkObservationRows([{ ...good, startTime: "2026-12-04T07:00:00Z" }], now).ok).toBe(true);
  });

  it("bounds a request to 1–1000 rows", () => {
    expect(observationsBodySchema.safeParse({ observations: [] }).success).toBe(false);
    expect(observationsBodySchema.safeParse({ observations: Array(1000).fill(good) }).success).toBe(true);
    expect(observationsBodySchema.safeParse({ observations: Array(1001).fill(good) }).success).toBe(false);
  });
});

describe("parseObservationCsv", () => {
  const header = "ra_deg,dec_deg,start_utc,exposure_s,filter,limiting_mag";
  it("turns data rows into row objects, empty cells left out, quoted cells kept whole", () => {
    const parsed = parseObservationCsv(`${header}\r\n123.4,-35,2026-12-04T05:00:00Z,120,r,21.5\n\n10,5,2026-12-04T05:10:00Z,60,"g,wide",\n`);
    expect(parsed).toEqual({
      ok: true,
      rows: [
        { raDeg: 123.4, decDeg: -35, startTime: "2026-12-04T05:00:00Z", exposureS: 120, filter: "r", limitingMagnitude: 21.5 },
        { raDeg: 10, decDeg: 5, startTime: "2026-12-04T05:10:00Z", exposureS: 60, filter: "g,wide" },
      ],
    });
    if (parsed.ok) expect(checkObservationRows(parsed.rows, now).ok).toBe(true);
  });

  it.each([
    ["", 0, "file"],
    [`${header}\n`, 0, "file"],
    ["ra_deg,dec_deg,start_utc,exposure_s", 0, "filter"],
    [`${header},colour\n1,2,2026-12-04T05:00:00Z,60,r,20,red`, 0, "colour"],
    [`${header}\n1,2,2026-12-04T05:00:00Z,60,r,20\n1,2,2026-12-04T05:00:00Z,sixty,r,20`, 2, "exposureS"],
    [`${header}\n1,2,2026-12-04T05:00:00Z,60,r`, 1, "row"],
  ])("refuses a bad file as a whole (case %#)", (text, row, field) => {
    expect(parseObservationCsv(text)).toMatchObject({ ok: false, problem: { row, field } });
  });

  it("takes 10 000 rows and refuses 10 001", () => {
    const line = "1,2,2026-12-04T05:00:00Z,60,r,20";
    const file = (n: number) => [header, ...Array<string>(n).fill(line)].join("\n");
    const ok = parseObservationCsv(file(10_000));
    expect(ok.ok && ok.rows.length).toBe(10_000);
    expect(parseObservationCsv(file(10_001))).toMatchObject({ ok: false, problem: { row: 0, field: "file" } });
  });

  it("reports a bad value by data row and JSON field once parsed", () => {
    const parsed = parseObservationCsv(`${header}\n1,2,2026-12-04T05:00:00Z,60,r,20\n400,2,2026-12-04T05:00:00Z,60,r,20`);
    expect(parsed.ok && checkObservationRows(parsed.rows, now)).toMatchObject({ ok: false, problem: { row: 2, field: "raDeg" } });
  });
});
