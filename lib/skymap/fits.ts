import { gunzipSync } from "node:zlib";
import { SkymapError } from "./errors";
import {
  FITS_BLOCK_BYTES,
  type FitsHeader,
  headerInteger,
  headerString,
  parseHeader,
} from "./fits-header";

export { type FitsHeader, type FitsValue, headerString } from "./fits-header";

/** Uploads larger than this (compressed or not) are refused; the issue asks for 200 MB. */
export const DEFAULT_MAX_FITS_BYTES = 200 * 1024 * 1024;
const MAX_HDUS = 64;

export interface FitsHdu {
  index: number;
  /** XTENSION value ("BINTABLE", "IMAGE", …) or "PRIMARY". */
  kind: string;
  header: FitsHeader;
  dataOffset: number;
  dataBytes: number;
}

export interface FitsFile {
  /** The decompressed bytes the HDU offsets refer to. */
  bytes: Uint8Array;
  gzipped: boolean;
  hdus: FitsHdu[];
}

export interface ReadFitsOptions {
  maxBytes?: number;
}

/** True when the bytes start with the gzip magic number 1f 8b (RFC 1952 §2.3.1). */
export function isGzip(bytes: Uint8Array): boolean {
  return bytes.length >= 2 && bytes[0] === 0x1f && bytes[1] === 0x8b;
}

/** Gunzips when needed, refusing to expand past `maxBytes` (a guard against decompression bombs). */
export function decompressIfGzip(bytes: Uint8Array, maxBytes = DEFAULT_MAX_FITS_BYTES): Uint8Array {
  if (bytes.length > maxBytes) {
    throw new SkymapError("too-large", `file is ${bytes.length} bytes, over the ${maxBytes}-byte limit`);
  }
  if (!isGzip(bytes)) return bytes;
  try {
    const out = gunzipSync(bytes, { maxOutputLength: maxBytes });
    return new Uint8Array(out.buffer, out.byteOffset, out.byteLength);
  } catch (error) {
    const code = (error as { code?: unknown }).code;
    if (error instanceof RangeError || code === "ERR_BUFFER_TOO_LARGE") {
      throw new SkymapError("too-large", `gzip content expands past the ${maxBytes}-byte limit`);
    }
    const reason = error instanceof Error ? error.message : String(error);
    throw new SkymapError("bad-gzip", `gzip stream is truncated or corrupt: ${reason}`);
  }
}

/**
 * Reads the header-and-data-unit structure of a FITS file (FITS Standard 4.0 §3–§7):
 * the primary HDU must start with SIMPLE = T; extensions follow on 2880-byte block boundaries.
 * Data are not decoded here; see fits-table.ts for binary tables.
 */
export function readFits(input: Uint8Array, options: ReadFitsOptions = {}): FitsFile {
  const gzipped = isGzip(input);
  const bytes = decompressIfGzip(input, options.maxBytes ?? DEFAULT_MAX_FITS_BYTES);
  if (bytes.length < 80 || asciiAt(bytes, 0, 8) !== "SIMPLE  ") {
    throw new SkymapError("not-fits", "not a FITS file: first card is not SIMPLE");
  }
  const hdus: FitsHdu[] = [];
  let offset = 0;
  while (offset < bytes.length && hdus.length < MAX_HDUS) {
    const index = hdus.length;
    if (index > 0 && asciiAt(bytes, offset, 8) !== "XTENSION") break; // trailing special records, §3.5
    const where = index === 0 ? "primary HDU" : `HDU ${index}`;
    const { header, endOffset } = parseHeader(bytes, offset, where);
    if (index === 0 && header.get("SIMPLE") !== true) {
      throw new SkymapError("not-fits", "not a FITS file: SIMPLE is not T");
    }
    const dataBytes = hduDataBytes(header, where);
    if (endOffset + dataBytes > bytes.length) {
      throw new SkymapError(
        "truncated",
        `${where}: data needs ${dataBytes} bytes after byte ${endOffset} but the file ends at byte ${bytes.length}`,
      );
    }
    const kind = index === 0 ? "PRIMARY" : (headerString(header, "XTENSION") ?? "UNKNOWN");
    hdus.push({ index, kind, header, dataOffset: endOffset, dataBytes });
    offset = endOffset + Math.ceil(dataBytes / FITS_BLOCK_BYTES) * FITS_BLOCK_BYTES;
  }
  return { bytes, gzipped, hdus };
}

/** §4.4.1.1 eq. 1 and §4.4.1.2 eq. 2: |BITPIX|/8 × GCOUNT × (PCOUNT + NAXIS1 × … × NAXISm). */
function hduDataBytes(header: FitsHeader, where: string): number {
  const bitpix = header.get("BITPIX");
  if (bitpix !== 8 && bitpix !== 16 && bitpix !== 32 && bitpix !== 64 && bitpix !== -32 && bitpix !== -64) {
    throw new SkymapError("bad-header", `${where}: BITPIX must be 8, 16, 32, 64, -32 or -64, got ${String(bitpix)}`);
  }
  const naxis = headerInteger(header, "NAXIS", where);
  if (naxis > 999) throw new SkymapError("bad-header", `${where}: NAXIS ${naxis} exceeds 999`);
  if (naxis === 0) return 0;
  let elements = 1;
  for (let axis = 1; axis <= naxis; axis++) elements *= headerInteger(header, `NAXIS${axis}`, where);
  const pcount = header.has("PCOUNT") ? headerInteger(header, "PCOUNT", where) : 0;
  const gcount = header.has("GCOUNT") ? headerInteger(header, "GCOUNT", where) : 1;
  return (Math.abs(bitpix) / 8) * gcount * (pcount + elements);
}

function asciiAt(bytes: Uint8Array, offset: number, length: number): string {
  let text = "";
  for (let i = 0; i < length; i++) text += String.fromCharCode(bytes[offset + i] ?? 0);
  return text;
}
