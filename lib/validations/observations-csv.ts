import { MAX_CSV_ROWS, type RowProblem } from "./observations";

/** Our CSV columns, each mapped to the JSON field it fills; the header must name the required ones. */
export const csvColumns = {
  ra_deg: "raDeg",
  dec_deg: "decDeg",
  start_utc: "startTime",
  exposure_s: "exposureS",
  filter: "filter",
  instrument_id: "instrumentId",
  limiting_mag: "limitingMagnitude",
  pointing_index: "pointingIndex",
} as const;
const required = ["ra_deg", "dec_deg", "start_utc", "exposure_s", "filter"] as const;
const numeric = new Set(["ra_deg", "dec_deg", "exposure_s", "limiting_mag", "pointing_index"]);

export type CsvParse = { ok: true; rows: Record<string, unknown>[] } | { ok: false; problem: RowProblem };

/**
 * Splits an uploaded log into row objects for checkObservationRows. Plain comma-separated values (RFC 4180
 * quoting with double quotes), a header row first; blank lines are skipped; an empty cell leaves the field
 * out. Row numbers in problems count data rows from 1 (the header is row 0).
 */
export function parseObservationCsv(text: string): CsvParse {
  const lines = text.replace(/^\uFEFF/, "").split(/\r?\n/).filter((l) => l.trim() !== "");
  const [headerLine, ...data] = lines;
  if (headerLine === undefined) return fail(0, "file", "the file is empty: give a header row and at least one observation");
  const header = splitLine(headerLine).map((h) => h.trim().toLowerCase());
  const unknown = header.find((h) => !(h in csvColumns));
  if (unknown !== undefined) return fail(0, unknown || "header", `unknown column "${unknown}"; the columns are ${Object.keys(csvColumns).join(", ")}`);
  const missing = required.find((r) => !header.includes(r));
  if (missing) return fail(0, missing, `the header has no ${missing} column`);
  if (new Set(header).size !== header.length) return fail(0, "header", "a column is named twice");
  if (data.length === 0) return fail(0, "file", "the file has a header but no observations");
  if (data.length > MAX_CSV_ROWS) return fail(0, "file", `at most ${MAX_CSV_ROWS} observations per file (this one has ${data.length})`);
  const rows: Record<string, unknown>[] = [];
  for (const [index, line] of data.entries()) {
    const cells = splitLine(line);
    if (cells.length !== header.length) return fail(index + 1, "row", `${cells.length} cells where the header has ${header.length}`);
    const row: Record<string, unknown> = {};
    for (const [k, column] of header.entries()) {
      const cell = (cells[k] ?? "").trim();
      if (cell === "") continue;
      const field = csvColumns[column as keyof typeof csvColumns];
      if (numeric.has(column)) {
        const n = Number(cell);
        if (!Number.isFinite(n)) return fail(index + 1, field, `"${cell}" is not a number`);
        row[field] = n;
      } else row[field] = cell;
    }
    rows.push(row);
  }
  return { ok: true, rows };
}

function fail(row: number, field: string, message: string): CsvParse {
  return { ok: false, problem: { row, field, message } };
}

/** One line's cells; a quoted cell may hold commas and doubled quotes (RFC 4180 §2), not line breaks. */
export function splitLine(line: string): string[] {
  const cells: string[] = [];
  let cell = "";
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cell += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ",") {
      cells.push(cell);
      cell = "";
    } else cell += ch;
  }
  cells.push(cell);
  return cells;
}

/** An upload of MAX_CSV_ROWS rows of every column stays well under this (about 120 bytes a row). */
export const MAX_CSV_BYTES = 4 * 1024 * 1024;
/** The multipart field the file travels in. */
export const observationCsvField = "file";
