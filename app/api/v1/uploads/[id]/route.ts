import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getUpload } from "@/lib/data/uploads";
import { readStored } from "@/lib/storage";
import { idParams } from "@/lib/validations/params";

const INLINE_TYPES = new Set(["image/png", "image/jpeg"]);

/** RFC 6266 Content-Disposition with an ASCII fallback and the UTF-8 name (RFC 8187). */
function contentDisposition(kind: "inline" | "attachment", name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, "_").replace(/["\\]/g, "_");
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

/** Downloads a stored file with its recorded type; images may show inline, everything else downloads. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params, req }) => {
  const upload = await getUpload(params.id);
  if (!upload) throw new ApiError(404, "file not found");
  let bytes: Buffer;
  try {
    bytes = await readStored(upload.sha256);
  } catch {
    throw new ApiError(410, "the stored file is missing on this server", { sha256: upload.sha256 });
  }
  const inline = INLINE_TYPES.has(upload.mimeType) && req.nextUrl.searchParams.get("download") !== "1";
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": upload.mimeType,
      "content-length": String(bytes.byteLength),
      "content-disposition": contentDisposition(inline ? "inline" : "attachment", upload.originalName),
      "cache-control": "private, max-age=3600",
      etag: `"${upload.sha256}"`,
    },
  });
});
