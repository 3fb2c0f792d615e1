import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { uploadSkymap } from "@/lib/data/skymaps";
import { parseMultipart, singleFile } from "@/lib/storage";
import { feedTargetParams } from "@/lib/validations/params";
import { maxSkymapBytes, skymapFileField } from "@/lib/validations/skymaps";

/** Multipart framing around the file: boundaries, part headers. */
const MULTIPART_SLACK_BYTES = 64 * 1024;

/**
 * The feed attaches a sky map to a candidate it posted: size (413) → signature over the raw bytes (401) →
 * multipart (415/422) → analysis and storage (see uploadSkymap). The body is read whole (≤ 200 MB) so the
 * signature is checked before anything is parsed.
 */
export const POST = handler(
  { feedSignature: true, maxBodyBytes: maxSkymapBytes + MULTIPART_SLACK_BYTES, params: feedTargetParams },
  async ({ req, raw, params, now }) => {
    const file = singleFile(await parseMultipart(raw, req.headers.get("content-type")), skymapFileField);
    const answer = await uploadSkymap({
      // Next hands route handlers their params decoded already; decoding again breaks ids containing "%".
      target: { source: params.source, externalId: params.externalId },
      fileName: file.name,
      bytes: file.bytes,
      actorId: null,
      via: "feed",
      now,
    });
    return NextResponse.json(answer, { status: 201 });
  },
);
