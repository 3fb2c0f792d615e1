/**
 * What a file really is, from its first bytes (magic numbers), for report attachments. The extension must
 * agree with the content; the client's claimed MIME type is ignored.
 * Signatures: PNG (ISO/IEC 15948 §5.2), JPEG (ITU-T T.81 SOI marker FF D8 FF), PDF (ISO 32000 §7.5.2 "%PDF-"),
 * FITS (FITS Standard 4.0 §4.4.1.1: first card SIMPLE = T), gzip (RFC 1952 §2.3.1: 1F 8B).
 */
export type FileKind = "png" | "jpeg" | "pdf" | "fits" | "fits-gzip" | "csv" | "text";

export interface SniffedType {
  kind: FileKind;
  mimeType: string;
  /** Extensions that may carry this kind. */
  extensions: readonly string[];
}

export const fileKinds: Record<FileKind, SniffedType> = {
  png: { kind: "png", mimeType: "image/png", extensions: ["png"] },
  jpeg: { kind: "jpeg", mimeType: "image/jpeg", extensions: ["jpg", "jpeg"] },
  pdf: { kind: "pdf", mimeType: "application/pdf", extensions: ["pdf"] },
  fits: { kind: "fits", mimeType: "application/fits", extensions: ["fits", "fit", "fts"] },
  "fits-gzip": { kind: "fits-gzip", mimeType: "application/gzip", extensions: ["gz"] },
  csv: { kind: "csv", mimeType: "text/csv; charset=utf-8", extensions: ["csv"] },
  text: { kind: "text", mimeType: "text/plain; charset=utf-8", extensions: ["txt", "dat", "log"] },
};

const startsWith = (bytes: Uint8Array, prefix: readonly number[]) =>
  bytes.length >= prefix.length && prefix.every((b, i) => bytes[i] === b);

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
const JPEG = [0xff, 0xd8, 0xff];
const PDF = [0x25, 0x50, 0x44, 0x46, 0x2d];
const GZIP = [0x1f, 0x8b];
const FITS_FIRST_CARD = /^SIMPLE  = {20}T/;

/** The kind by content alone, or null when it is none we accept. Text must be UTF-8 without NUL bytes. */
export function sniffContent(bytes: Uint8Array): Exclude<FileKind, "csv" | "text"> | "text" | null {
  if (startsWith(bytes, PNG)) return "png";
  if (startsWith(bytes, JPEG)) return "jpeg";
  if (startsWith(bytes, PDF)) return "pdf";
  if (startsWith(bytes, GZIP)) return "fits-gzip";
  if (bytes.length >= 30 && FITS_FIRST_CARD.test(String.fromCharCode(...bytes.subarray(0, 30)))) return "fits";
  return isUtf8Text(bytes) ? "text" : null;
}

function isUtf8Text(bytes: Uint8Array): boolean {
  if (bytes.length === 0) return false;
  const sample = bytes.subarray(0, 1 << 20);
  if (sample.includes(0)) return false;
  try {
    new TextDecoder("utf-8", { fatal: true }).decode(bytes);
    return true;
  } catch {
    return false;
  }
}

export type TypeCheck = { ok: true; type: SniffedType } | { ok: false; reason: string };

/**
 * Accepts a report file when its content is one we take and its extension matches that content
 * (`.fits.gz` for gzip'd FITS; `.csv` or `.txt` for text).
 */
export function checkReportFileType(fileName: string, bytes: Uint8Array): TypeCheck {
  const lower = fileName.toLowerCase();
  const extension = lower.includes(".") ? (lower.split(".").pop() ?? "") : "";
  const content = sniffContent(bytes);
  if (!content) {
    return { ok: false, reason: `${fileName}: content is not PNG, JPEG, FITS, PDF or UTF-8 text (checked by its first bytes)` };
  }
  if (content === "text") {
    if (extension === "csv") return { ok: true, type: fileKinds.csv };
    if (fileKinds.text.extensions.includes(extension)) return { ok: true, type: fileKinds.text };
    return { ok: false, reason: `${fileName}: text files must end in .csv, .txt, .dat or .log` };
  }
  if (content === "fits-gzip") {
    if (/\.(fits|fit|fts)\.gz$/.test(lower)) return { ok: true, type: fileKinds["fits-gzip"] };
    return { ok: false, reason: `${fileName}: gzip files are accepted only as compressed FITS (.fits.gz)` };
  }
  const type = fileKinds[content];
  if (!type.extensions.includes(extension)) {
    return { ok: false, reason: `${fileName}: the content is ${content.toUpperCase()} but the name ends in .${extension || "(none)"}` };
  }
  return { ok: true, type };
}
