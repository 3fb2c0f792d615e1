import { ApiError } from "@/lib/api/errors";
import { readBodyBytes } from "./body";
import { parseMultipart, singleFile } from "./multipart";

/**
 * A small text file sent either as the whole body (`text/csv`, `text/plain`) or as one file in a multipart form
 * field (what a browser's file input sends), read within `limitBytes` (413) and decoded as strict UTF-8 (422).
 * Any other Content-Type is 415 before the body is read.
 */
export async function readTextUpload(req: Request, limitBytes: number, field: string): Promise<string> {
  const contentType = req.headers.get("content-type");
  const type = (contentType ?? "").split(";")[0]?.trim().toLowerCase() ?? "";
  let bytes: Uint8Array;
  if (type === "text/csv" || type === "text/plain") {
    bytes = await readBodyBytes(req, limitBytes);
  } else if (type === "multipart/form-data") {
    bytes = singleFile(await parseMultipart(await readBodyBytes(req, limitBytes), contentType), field).bytes;
  } else {
    throw new ApiError(415, `send the file as text/csv, or as multipart/form-data with the file in field "${field}" (got ${contentType ?? "no Content-Type"})`, {
      contentType,
    });
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new ApiError(422, "the file is not UTF-8 text", { issues: [{ path: field, message: "not UTF-8 text" }] });
  }
}
