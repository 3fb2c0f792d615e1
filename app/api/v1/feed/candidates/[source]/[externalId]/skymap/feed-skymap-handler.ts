import { randomUUID } from "node:crypto";
import { NextResponse } from "next/server";
import { ApiError } from "@/lib/api/errors";
import { errorResponse } from "@/lib/api/handler";
import { uploadSkymap } from "@/lib/data/skymaps";
import { feedSigningSecret, verifyFeedSignature } from "@/lib/feed/signature";
import { parseMultipart, readBodyBytes, singleFile } from "@/lib/storage";
import { maxSkymapBytes, skymapFileField } from "@/lib/validations/skymaps";

/** Multipart framing around the file: boundaries, part headers. */
const MULTIPART_SLACK_BYTES = 64 * 1024;

export interface FeedSkymapOptions {
  /** the receiver's clock, Unix ms (tests inject one) */
  now?: () => number;
  secret?: () => string;
}

/**
 * `POST /api/v1/feed/candidates/{source}/{externalId}/skymap`: size (413, from Content-Length, then while
 * reading) → signature over the raw bytes (401) → multipart (415/422) → analysis and storage (see uploadSkymap).
 * The body is read whole (≤ 200 MB) so the signature can be checked before anything is parsed.
 */
export function createFeedSkymapHandler(options: FeedSkymapOptions = {}) {
  const now = options.now ?? Date.now;
  const secret = options.secret ?? (() => feedSigningSecret());
  return async (req: Request, ctx: { params: Promise<{ source: string; externalId: string }> }): Promise<Response> => {
    const requestId = randomUUID();
    try {
      const receivedMs = now();
      const raw = await readBodyBytes(req, maxSkymapBytes + MULTIPART_SLACK_BYTES);
      const signature = verifyFeedSignature(secret(), req.headers, raw, receivedMs);
      if (!signature.ok) throw new ApiError(401, `feed signature refused: ${signature.reason}`);
      const { source, externalId } = await ctx.params;
      const file = singleFile(await parseMultipart(raw, req.headers.get("content-type")), skymapFileField);
      const answer = await uploadSkymap({
        // Next hands route handlers their params decoded already; decoding again breaks ids containing "%".
        target: { source, externalId },
        fileName: file.name,
        bytes: file.bytes,
        actorId: null,
        via: "feed",
        now: new Date(receivedMs),
      });
      return NextResponse.json(answer, { status: 201 });
    } catch (error) {
      return errorResponse(error, requestId);
    }
  };
}
