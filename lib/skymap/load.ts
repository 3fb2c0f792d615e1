import { SkymapError } from "./errors";
import { type FitsHeader, headerString, readFits, type ReadFitsOptions } from "./fits";
import { type BinTable, binTables, findColumn, readNumericColumn } from "./fits-table";
import { nside2npix, nsideToOrder } from "./healpix";
import { readDistanceColumns } from "./distance-columns";
import { buildMultiOrder } from "./multiorder";
import type { FlatSkymap, SkymapMap } from "./types";
import { checkProbabilities, normalise } from "./validate";

export interface LoadedSkymap {
  map: SkymapMap;
  totalProbability: number;
  normalised: boolean;
  warnings: string[];
}

/** 805 M pixels; ringToNest's bit interleaving also stops at 2^15. Larger flat maps should be multi-order. */
const MAX_FLAT_NSIDE = 8192;
const CELESTIAL = new Set(["C", "Q", "CELESTIAL", "EQUATORIAL"]);

/**
 * Reads a HEALPix probability map from FITS bytes (gzip allowed): flat RING/NESTED with a probability
 * column (PROB, else the first column) or multi-order NUNIQ with UNIQ + PROBDENSITY. Throws SkymapError.
 */
export function loadSkymap(bytes: Uint8Array, options: ReadFitsOptions = {}): LoadedSkymap {
  const file = readFits(bytes, options);
  const tables = binTables(file);
  const table =
    tables.find((t) => headerString(t.hdu.header, "PIXTYPE")?.toUpperCase() === "HEALPIX") ?? tables[0];
  if (!table) throw new SkymapError("no-table", "no BINTABLE extension holding the HEALPix map");
  const primary = file.hdus[0]?.header;
  const keyword = (key: string) => headerString(table.hdu.header, key) ?? (primary && headerString(primary, key));
  const warnings: string[] = [];

  const coordsys = keyword("COORDSYS")?.toUpperCase();
  if (coordsys === undefined) warnings.push("COORDSYS missing; assumed equatorial (C)");
  else if (!CELESTIAL.has(coordsys)) {
    throw new SkymapError("unsupported-layout", `COORDSYS ${coordsys} is not supported; only equatorial (C) maps`);
  }
  const ordering = keyword("ORDERING")?.toUpperCase();
  if (ordering === undefined) throw new SkymapError("bad-ordering", "ORDERING keyword is missing");
  if (ordering !== "RING" && ordering !== "NESTED" && ordering !== "NUNIQ") {
    throw new SkymapError("bad-ordering", `ORDERING must be RING, NESTED or NUNIQ, got ${ordering}`);
  }

  if (ordering === "NUNIQ") {
    const uniqColumn = findColumn(table, "UNIQ");
    if (!uniqColumn) throw new SkymapError("missing-column", "ORDERING is NUNIQ but there is no UNIQ column");
    const densityColumn = findColumn(table, "PROBDENSITY");
    const probColumn = densityColumn ?? findColumn(table, "PROB");
    if (!probColumn) {
      throw new SkymapError("missing-column", "multi-order map has neither a PROBDENSITY nor a PROB column");
    }
    if (!densityColumn) warnings.push("no PROBDENSITY column; PROB read as probability per pixel");
    const values = readNumericColumn(file, table, probColumn);
    checkProbabilities(values, probColumn.name);
    const uniq = readNumericColumn(file, table, uniqColumn);
    const built = buildMultiOrder(uniq, values, densityColumn ? "density" : "probability", warnings);
    const distance = readDistanceColumns(file, table, uniq.length, warnings);
    if (distance) built.map.distance = distance;
    return { ...built, warnings };
  }

  if (headerString(table.hdu.header, "INDXSCHM")?.toUpperCase() === "EXPLICIT") {
    throw new SkymapError("unsupported-layout", "partial-sky flat maps (INDXSCHM EXPLICIT) are not supported");
  }
  const column = findColumn(table, "PROB") ?? table.columns[0];
  if (!column) throw new SkymapError("missing-column", "the map table has no columns");
  if (column.name !== "PROB") warnings.push(`no PROB column; read the first column, ${column.name}`);
  const probability = readNumericColumn(file, table, column);
  const nside = flatNside(table, table.hdu.header, probability.length, column.name, warnings);
  checkProbabilities(probability, column.name);
  const { total, normalised } = normalise(probability, warnings);
  const map: FlatSkymap = {
    layout: ordering === "RING" ? "flat-ring" : "flat-nested",
    nside,
    order: nsideToOrder(nside) ?? 0,
    probability,
  };
  const distance = readDistanceColumns(file, table, probability.length, warnings);
  if (distance) map.distance = distance;
  return { map, totalProbability: total, normalised, warnings };
}

function flatNside(table: BinTable, header: FitsHeader, count: number, name: string, warnings: string[]): number {
  const declared = header.get("NSIDE");
  if (declared === undefined) {
    const inferred = Math.round(Math.sqrt(count / 12));
    if (nside2npix(inferred) !== count || nsideToOrder(inferred) === undefined || inferred > MAX_FLAT_NSIDE) {
      throw new SkymapError("bad-nside", `NSIDE missing and ${count} pixels is not 12 × nside² for a power-of-two nside`);
    }
    warnings.push(`NSIDE missing; inferred ${inferred} from ${count} pixels`);
    return inferred;
  }
  if (typeof declared !== "number" || nsideToOrder(declared) === undefined || declared > MAX_FLAT_NSIDE) {
    throw new SkymapError("bad-nside", `NSIDE must be a power of two from 1 to ${MAX_FLAT_NSIDE}, got ${String(declared)}`);
  }
  if (nside2npix(declared) !== count) {
    throw new SkymapError(
      "bad-nside",
      `NSIDE ${declared} implies ${nside2npix(declared)} pixels but column ${name} holds ${count} (HDU ${table.hdu.index})`,
    );
  }
  return declared;
}
