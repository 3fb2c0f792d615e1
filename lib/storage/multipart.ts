import { ApiError } from "@/lib/api/errors";

export interface UploadedPart {
  field: string;
  name: string;
  /** The type the client claimed; never trusted for checks (see file-type.ts). */
  claimedType: string;
  bytes: Uint8Array;
}

export interface MultipartBody {
  files: UploadedPart[];
  fields: Record<string, string>;
}

/** Refuses (415) a request that is not multipart/form-data, before its body is read. */
export function requireMultipart(contentType: string | null): string {
  if (!contentType || !/^multipart\/form-data\s*;\s*boundary=/i.test(contentType)) {
    throw new ApiError(415, "send the file as multipart/form-data (with a boundary)", { contentType });
  }
  return contentType;
}

/**
 * Parses a multipart/form-data body already read into memory (so a signature can be checked over the raw
 * bytes first) with the platform's own parser (`Response.formData()`, undici in Node). Not multipart → 415.
 */
export async function parseMultipart(bytes: Uint8Array<ArrayBuffer>, contentType: string | null): Promise<MultipartBody> {
  const type = requireMultipart(contentType);
  let form: FormData;
  try {
    form = await new Response(bytes, { headers: { "content-type": type } }).formData();
  } catch (error) {
    throw new ApiError(400, `the multipart body could not be read: ${(error as Error).message}`);
  }
  const files: UploadedPart[] = [];
  const fields: Record<string, string> = {};
  for (const [field, value] of form.entries()) {
    if (typeof value === "string") fields[field] = value;
    else files.push({ field, name: value.name || "upload", claimedType: value.type, bytes: new Uint8Array(await value.arrayBuffer()) });
  }
  return { files, fields };
}

/** The single file in `field`, or 422 naming the field. */
export function singleFile(body: MultipartBody, field: string): UploadedPart {
  const matches = body.files.filter((f) => f.field === field);
  if (matches.length !== 1) {
    throw new ApiError(422, `send exactly one file in the multipart field "${field}" (got ${matches.length})`, {
      issues: [{ path: field, message: "one file required" }],
    });
  }
  return matches[0] as UploadedPart;
}
