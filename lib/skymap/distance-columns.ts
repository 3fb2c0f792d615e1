import type { DistanceLayers } from "./distance";
import { SkymapError } from "./errors";
import type { FitsFile } from "./fits";
import { type BinTable, findColumn, readNumericColumn } from "./fits-table";

const NAMES = ["DISTMU", "DISTSIGMA", "DISTNORM"] as const;

/**
 * Reads the distance ansatz columns of a 3D map (Singer et al. 2016, ApJS 226 10) when all three are present.
 * DISTMU may be +∞ and DISTNORM 0 where a pixel has no distance (the files' own convention); NaN, a negative
 * DISTSIGMA or DISTNORM are refused. One or two of the three alone earn a warning and are ignored.
 */
export function readDistanceColumns(file: FitsFile, table: BinTable, expected: number, warnings: string[]): DistanceLayers | undefined {
  const columns = NAMES.flatMap((name) => findColumn(table, name) ?? []);
  if (columns.length === 0) return undefined;
  if (columns.length < NAMES.length) {
    warnings.push(`distance columns incomplete (${columns.map((c) => c.name).join(", ")} only); the map is read without distances`);
    return undefined;
  }
  const [mu, sigma, norm] = columns.map((column) => {
    const values = readNumericColumn(file, table, column);
    if (values.length !== expected) {
      throw new SkymapError("bad-header", `column ${column.name} holds ${values.length} values for ${expected} pixels`);
    }
    return values;
  }) as [Float64Array, Float64Array, Float64Array];
  for (let i = 0; i < expected; i++) {
    const m = mu[i] ?? 0;
    const s = sigma[i] ?? 0;
    const n = norm[i] ?? 0;
    if (Number.isNaN(m) || Number.isNaN(s) || Number.isNaN(n)) {
      throw new SkymapError("non-finite", `distance columns hold NaN in pixel row ${i + 1}`);
    }
    if (s < 0 || n < 0) {
      throw new SkymapError("negative", `DISTSIGMA and DISTNORM must be ≥ 0; pixel row ${i + 1} has ${s} and ${n}`);
    }
  }
  return { muMpc: mu, sigmaMpc: sigma, normPerMpc2: norm };
}
