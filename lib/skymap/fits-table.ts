import { SkymapError } from "./errors";
import { headerInteger, headerNumber, headerString } from "./fits-header";
import type { FitsFile, FitsHdu } from "./fits";

/** One field of a binary table (FITS 4.0 §7.3.1–§7.3.3). */
export interface BinTableColumn {
  /** TTYPEn, upper-cased; "COLn" when absent. */
  name: string;
  /** TFORMn type letter: L X B I J K A E D C M P Q. */
  type: string;
  repeat: number;
  /** Offset of the field inside a row, in bytes. */
  offsetBytes: number;
  /** Width of one element in bytes (the whole field for X). */
  elementBytes: number;
  scale: number;
  zero: number;
  nullValue: number | undefined;
  unit: string | undefined;
}

export interface BinTable {
  hdu: FitsHdu;
  rowBytes: number;
  rows: number;
  columns: BinTableColumn[];
}

// Table 18 of FITS 4.0: bytes per element of each TFORM type letter
const ELEMENT_BYTES: Record<string, number> = {
  L: 1, X: 1, B: 1, I: 2, J: 4, K: 8, A: 1, E: 4, D: 8, C: 8, M: 16, P: 8, Q: 16,
};
const NUMERIC_TYPES = new Set(["L", "B", "I", "J", "K", "E", "D"]);

/** The binary-table extensions of a file, with their column layout checked against NAXIS1. */
export function binTables(file: FitsFile): BinTable[] {
  return file.hdus.filter((hdu) => hdu.kind === "BINTABLE").map(describeBinTable);
}

export function describeBinTable(hdu: FitsHdu): BinTable {
  const where = `HDU ${hdu.index} (BINTABLE)`;
  const { header } = hdu;
  if (header.get("BITPIX") !== 8 || header.get("NAXIS") !== 2) {
    throw new SkymapError("bad-header", `${where}: BINTABLE needs BITPIX = 8 and NAXIS = 2 (§7.3.1)`);
  }
  const rowBytes = headerInteger(header, "NAXIS1", where);
  const rows = headerInteger(header, "NAXIS2", where);
  const fields = headerInteger(header, "TFIELDS", where);
  if (fields > 999) throw new SkymapError("bad-header", `${where}: TFIELDS ${fields} exceeds 999`);
  const columns: BinTableColumn[] = [];
  let offsetBytes = 0;
  for (let n = 1; n <= fields; n++) {
    const form = headerString(header, `TFORM${n}`);
    const match = form === undefined ? null : /^(\d*)([LXBIJKAEDCMPQ])/.exec(form.toUpperCase());
    if (!match) {
      throw new SkymapError("bad-header", `${where}: TFORM${n} is ${form ?? "missing"}, not a binary-table format`);
    }
    const type = match[2] ?? "";
    const repeat = match[1] ? Number(match[1]) : 1;
    const elementBytes = ELEMENT_BYTES[type] ?? 0;
    const fieldBytes = type === "X" ? Math.ceil(repeat / 8) : repeat * elementBytes;
    const nullRaw = header.get(`TNULL${n}`);
    columns.push({
      name: (headerString(header, `TTYPE${n}`) ?? `COL${n}`).toUpperCase(),
      type,
      repeat,
      offsetBytes,
      elementBytes: type === "X" ? fieldBytes : elementBytes,
      scale: headerNumber(header, `TSCAL${n}`, 1),
      zero: headerNumber(header, `TZERO${n}`, 0),
      nullValue: typeof nullRaw === "number" ? nullRaw : undefined,
      unit: headerString(header, `TUNIT${n}`),
    });
    offsetBytes += fieldBytes;
  }
  if (offsetBytes !== rowBytes) {
    throw new SkymapError("bad-header", `${where}: columns add up to ${offsetBytes} bytes but NAXIS1 is ${rowBytes}`);
  }
  return { hdu, rowBytes, rows, columns };
}

export function findColumn(table: BinTable, name: string): BinTableColumn | undefined {
  const wanted = name.toUpperCase();
  return table.columns.find((column) => column.name === wanted);
}

/**
 * Decodes a numeric column to doubles, row by row, all `repeat` elements of each row in order
 * (so a 1024E column of N rows gives N × 1024 values). Big-endian per §5.2; TSCAL/TZERO applied,
 * TNULL integers become NaN (§7.3.2). 64-bit integers beyond ±2^53 are refused, not rounded.
 */
export function readNumericColumn(file: FitsFile, table: BinTable, column: BinTableColumn): Float64Array {
  if (!NUMERIC_TYPES.has(column.type)) {
    throw new SkymapError(
      "unsupported-column",
      `column ${column.name} has TFORM type ${column.type}; only L, B, I, J, K, E, D can be read as numbers`,
    );
  }
  const { rows, rowBytes } = table;
  const { repeat, elementBytes, type, scale, zero, nullValue } = column;
  const view = new DataView(file.bytes.buffer, file.bytes.byteOffset + table.hdu.dataOffset, rows * rowBytes);
  const out = new Float64Array(rows * repeat);
  const scaled = scale !== 1 || zero !== 0;
  const checkNull = nullValue !== undefined && type !== "E" && type !== "D";
  if ((type === "E" || type === "D") && !scaled) {
    readFloats(view, out, rows, rowBytes, column.offsetBytes, repeat, type === "D");
    return out;
  }
  let k = 0;
  for (let row = 0; row < rows; row++) {
    let at = row * rowBytes + column.offsetBytes;
    for (let e = 0; e < repeat; e++, at += elementBytes, k++) {
      let value = readElement(view, at, type, column.name);
      if (checkNull && value === nullValue) value = Number.NaN;
      else if (scaled) value = zero + scale * value;
      out[k] = value;
    }
  }
  return out;
}

/** The hot path for probability columns: plain big-endian floats, one tight loop per width. */
function readFloats(view: DataView, out: Float64Array, rows: number, rowBytes: number, offset: number, repeat: number, double: boolean): void {
  let k = 0;
  for (let row = 0; row < rows; row++) {
    let at = row * rowBytes + offset;
    if (double) {
      for (let e = 0; e < repeat; e++, at += 8) out[k++] = view.getFloat64(at, false);
    } else {
      for (let e = 0; e < repeat; e++, at += 4) out[k++] = view.getFloat32(at, false);
    }
  }
}

function readElement(view: DataView, at: number, type: string, name: string): number {
  switch (type) {
    case "E":
      return view.getFloat32(at, false);
    case "D":
      return view.getFloat64(at, false);
    case "J":
      return view.getInt32(at, false);
    case "I":
      return view.getInt16(at, false);
    case "B":
      return view.getUint8(at);
    case "L": {
      const byte = view.getUint8(at);
      return byte === 0x54 ? 1 : byte === 0x46 ? 0 : Number.NaN; // 'T', 'F', else undefined
    }
    default: {
      // K: two 32-bit words, no BigInt; exact while |value| < 2^53 (high word within ±2^21)
      const high = view.getInt32(at, false);
      const low = view.getUint32(at + 4, false);
      if (high >= 0x200000 || high < -0x200000) {
        throw new SkymapError("unsupported-column", `column ${name} holds a 64-bit integer beyond ±2^53`);
      }
      return high * 4294967296 + low;
    }
  }
}
