import { z } from "zod";
import { splitLine } from "./observations-csv";

/** Upload limits: the 5 000 000 rows, lines of at most 1 000 characters, files of at most 1 GiB. */
export const MAX_CATALOGUE_ROWS = 5_000_000;
export const MAX_CATALOGUE_LINE_CHARS = 1_000;
export const MAX_CATALOGUE_BYTES = 1024 ** 3;
export const MAX_GALAXY_NAME_CHARS = 100;

/** Our columns, in the order the issue gives them; `weight` may be left out of the header or of a row (then 1). */
export const catalogueColumns = ["name", "raDeg", "decDeg", "distanceMpc", "weight"] as const;
export type CatalogueColumn = (typeof catalogueColumns)[number];
const requiredColumns: readonly CatalogueColumn[] = ["name", "raDeg", "decDeg", "distanceMpc"];

export interface CatalogueRow {
  name: string;
  raDeg: number;
  decDeg: number;
  distanceMpc: number;
  weight: number;
}

/** What is wrong and where: `row` counts data rows from 1 (row N is line N + 1; the header is row 0). */
export interface CatalogueProblem {
  row: number;
  column: string;
  message: string;
}

export type HeaderParse = { ok: true; columns: Record<CatalogueColumn, number>; width: number } | { ok: false; problem: CatalogueProblem };
export type RowParse = { ok: true; row: CatalogueRow } | { ok: false; problem: CatalogueProblem };

const fail = (row: number, column: string, message: string) => ({ ok: false as const, problem: { row, column, message } });

/** The header row: each of our columns at most once, the four required ones present, nothing else. */
export function parseCatalogueHeader(line: string): HeaderParse {
  const names = splitLine(line.replace(/^\uFEFF/, "")).map((h) => h.trim());
  const columns = { name: -1, raDeg: -1, decDeg: -1, distanceMpc: -1, weight: -1 } as Record<CatalogueColumn, number>;
  for (const [i, raw] of names.entries()) {
    const known = catalogueColumns.find((c) => c.toLowerCase() === raw.toLowerCase());
    if (!known) return fail(0, raw || `column ${i + 1}`, `unknown column "${raw}"; the header is ${catalogueColumns.join(",")} (weight optional)`);
    if (columns[known] !== -1) return fail(0, known, `the column ${known} is named twice`);
    columns[known] = i;
  }
  const missing = requiredColumns.find((c) => columns[c] === -1);
  if (missing) return fail(0, missing, `the header has no ${missing} column; it is ${catalogueColumns.join(",")} (weight optional)`);
  return { ok: true, columns, width: names.length };
}

// A plain decimal number (no hex, no "Infinity", no empty string, which Number() would all accept).
const decimal = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** One data row, checked cell by cell; the first problem names the row and the column. */
export function parseCatalogueRow(line: string, columns: Record<CatalogueColumn, number>, width: number, row: number): RowParse {
  const cells = line.includes('"') ? splitLine(line) : line.split(",");
  if (cells.length !== width) return fail(row, "row", `${cells.length} cells where the header has ${width}`);
  const name = (cells[columns.name] ?? "").trim();
  if (name === "") return fail(row, "name", "a galaxy needs a name");
  if (name.length > MAX_GALAXY_NAME_CHARS) return fail(row, "name", `at most ${MAX_GALAXY_NAME_CHARS} characters`);
  const numbers: Partial<Record<CatalogueColumn, number>> = {};
  for (const column of ["raDeg", "decDeg", "distanceMpc", "weight"] as const) {
    const at = columns[column];
    const cell = at === -1 ? "" : (cells[at] ?? "").trim();
    if (cell === "") {
      if (column === "weight") continue;
      return fail(row, column, "is empty");
    }
    if (!decimal.test(cell)) return fail(row, column, `"${cell.slice(0, 40)}" is not a number`);
    numbers[column] = Number(cell);
  }
  const { raDeg = 0, decDeg = 0, distanceMpc = 0, weight = 1 } = numbers;
  if (!(raDeg >= 0 && raDeg < 360)) return fail(row, "raDeg", `${raDeg} is outside 0 ≤ raDeg < 360`);
  if (!(decDeg >= -90 && decDeg <= 90)) return fail(row, "decDeg", `${decDeg} is outside −90 ≤ decDeg ≤ 90`);
  if (!(distanceMpc > 0 && Number.isFinite(distanceMpc))) return fail(row, "distanceMpc", `${distanceMpc} is not a distance above 0`);
  if (!(weight >= 0 && Number.isFinite(weight))) return fail(row, "weight", `${weight} is not a weight of 0 or more`);
  return { ok: true, row: { name, raDeg, decDeg, distanceMpc, weight } };
}

export const catalogueNameSchema = z.string().trim().min(1, "must not be empty").max(100, "must be at most 100 characters");

/** PATCH /api/v1/catalogues/{id}: rename, or make it the default (only `true`: the default moves, never vanishes). */
export const cataloguePatchSchema = z
  .object({ name: catalogueNameSchema.optional(), isDefault: z.literal(true).optional() })
  .strict()
  .refine((b) => b.name !== undefined || b.isDefault !== undefined, { message: "give name or isDefault" });
export type CataloguePatch = z.infer<typeof cataloguePatchSchema>;

/** GET /api/v1/candidates/{id}/galaxies: which catalogue (the default if absent), how many, for which site. */
export const galaxyRankQuerySchema = z.object({
  catalogueId: z.string().min(1).max(200).optional(),
  limit: z.coerce.number().int("limit must be a whole number").min(1, "limit must be at least 1").max(1000, "limit must be at most 1000").default(100),
  siteId: z.string().min(1).max(200).optional(),
  /** the greedy credible region whose galaxies are scored and summed */
  level: z.coerce.number().finite().min(0.5, "level must be at least 0.5").max(0.999, "level must be at most 0.999").default(0.99),
});
export type GalaxyRankQuery = z.infer<typeof galaxyRankQuerySchema>;
