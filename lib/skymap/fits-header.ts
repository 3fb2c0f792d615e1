import { SkymapError } from "./errors";

/** FITS Standard 4.0 §3.1, §4.1: 2880-byte blocks of 36 cards of 80 ASCII characters. */
export const FITS_BLOCK_BYTES = 2880;
export const FITS_CARD_BYTES = 80;

export type FitsValue = string | number | boolean;
export type FitsHeader = ReadonlyMap<string, FitsValue>;

export interface ParsedHeader {
  header: FitsHeader;
  /** Byte offset of the first byte after the header's last (padded) block. */
  endOffset: number;
}

const MAX_HEADER_BLOCKS = 1000;

/**
 * Reads one header starting at `offset` (FITS 4.0 §4.1–4.2). `where` names the HDU in error messages.
 * Keeps the first occurrence of each keyword; commentary cards (COMMENT, HISTORY, blank) are skipped.
 */
export function parseHeader(bytes: Uint8Array, offset: number, where: string): ParsedHeader {
  const header = new Map<string, FitsValue>();
  for (let block = 0; block < MAX_HEADER_BLOCKS; block++) {
    const blockStart = offset + block * FITS_BLOCK_BYTES;
    if (blockStart + FITS_BLOCK_BYTES > bytes.length) {
      throw new SkymapError(
        "truncated",
        `${where}: file ends inside the header (at byte ${bytes.length}, before an END card)`,
      );
    }
    for (let card = 0; card < 36; card++) {
      const start = blockStart + card * FITS_CARD_BYTES;
      const text = cardText(bytes, start, where);
      const keyword = text.slice(0, 8).trimEnd();
      if (keyword === "END") return { header, endOffset: blockStart + FITS_BLOCK_BYTES };
      if (text.slice(8, 10) !== "= " || header.has(keyword)) continue;
      header.set(keyword, parseValue(text.slice(10), keyword, where));
    }
  }
  throw new SkymapError("bad-header", `${where}: no END card in the first ${MAX_HEADER_BLOCKS} header blocks`);
}

function cardText(bytes: Uint8Array, start: number, where: string): string {
  let text = "";
  for (let i = 0; i < FITS_CARD_BYTES; i++) {
    const code = bytes[start + i] ?? 0;
    // §4.1.1: header cards hold only printable ASCII (0x20–0x7E)
    if (code < 0x20 || code > 0x7e) {
      throw new SkymapError(
        "bad-header",
        `${where}: header card at byte ${start} holds a non-ASCII byte 0x${code.toString(16).padStart(2, "0")}`,
      );
    }
    text += String.fromCharCode(code);
  }
  return text;
}

/** §4.2: character strings in quotes ('' escapes a quote), logical T/F, integers, reals (E or D exponent). */
function parseValue(field: string, keyword: string, where: string): FitsValue {
  const trimmed = field.trimStart();
  if (trimmed.startsWith("'")) {
    let value = "";
    for (let i = 1; i < trimmed.length; i++) {
      const ch = trimmed[i];
      if (ch === "'") {
        if (trimmed[i + 1] === "'") {
          value += "'";
          i++;
          continue;
        }
        return value.trimEnd();
      }
      value += ch;
    }
    throw new SkymapError("bad-header", `${where}: keyword ${keyword} has an unterminated string value`);
  }
  const slash = trimmed.indexOf("/");
  const raw = (slash >= 0 ? trimmed.slice(0, slash) : trimmed).trim();
  if (raw === "T") return true;
  if (raw === "F") return false;
  if (raw === "") return "";
  const numeric = Number(raw.replace(/[dD]/, "E"));
  // Complex values "(re, im)" and anything else unparsed stay as their text
  return Number.isNaN(numeric) ? raw : numeric;
}

export function headerString(header: FitsHeader, key: string): string | undefined {
  const value = header.get(key);
  return typeof value === "string" ? value.trim() : undefined;
}

/** A required non-negative integer keyword, or a typed error naming it. */
export function headerInteger(header: FitsHeader, key: string, where: string): number {
  const value = header.get(key);
  if (typeof value !== "number" || !Number.isSafeInteger(value) || value < 0) {
    const got = value === undefined ? "missing" : `got ${String(value)}`;
    throw new SkymapError("bad-header", `${where}: keyword ${key} must be a non-negative integer (${got})`);
  }
  return value;
}

export function headerNumber(header: FitsHeader, key: string, fallback: number): number {
  const value = header.get(key);
  return typeof value === "number" ? value : fallback;
}
