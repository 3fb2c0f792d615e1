import { createHmac, randomUUID, timingSafeEqual } from "node:crypto";
import { NextResponse } from "next/server";
import { ApiError } from "@/lib/api/errors";
import { errorResponse } from "@/lib/api/handler";
import { uploadSkymap } from "@/lib/data/skymaps";
import { feedSigningSecret, signatureHeader, signatureToleranceSeconds, timestampHeader } from "@/lib/feed/signature";
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
 * The ingest route's signature (HMAC-SHA256, RFC 2104, of "<timestamp>." followed by the body) computed over the
 * raw body BYTES: a multipart body with a binary file is not text, so lib/feed/signature's string form cannot be
 * used as is. For a UTF-8 body both give the same digest.
 */
export function verifySignedBytes(secret: string, headers: Headers, body: Uint8Array, nowMs: number): { ok: true } | { ok: false; reason: string } {
  const timestamp = headers.get(timestampHeader);
  const signature = headers.get(signatureHeader);
  if (!timestamp || !signature) return { ok: false, reason: "missing X-Feed-Timestamp or X-Feed-Signature" };
  if (!/^\d{1,12}$/.test(timestamp)) return { ok: false, reason: "X-Feed-Timestamp must be Unix seconds" };
  if (Math.abs(nowMs / 1000 - Number(timestamp)) > signatureToleranceSeconds) {
    return { ok: false, reason: `timestamp is more than ${signatureToleranceSeconds} s from the server clock` };
  }
  const match = /^sha256=([0-9a-f]{64})$/i.exec(signature.trim());
  if (!match?.[1]) return { ok: false, reason: "X-Feed-Signature must be sha256=<64 hex digits>" };
  const expected = createHmac("sha256", secret).update(`${timestamp}.`).update(body).digest();
  if (!timingSafeEqual(expected, Buffer.from(match[1], "hex"))) return { ok: false, reason: "signature does not match" };
  return { ok: true };
}

/** Headers for a signed feed upload (tests, fakes, scripts). */
export function signFeedBytes(secret: string, body: Uint8Array, nowMs: number): Record<string, string> {
  const timestamp = Math.floor(nowMs / 1000);
  const digest = createHmac("sha256", secret).update(`${timestamp}.`).update(body).digest("hex");
  return { "X-Feed-Timestamp": String(timestamp), "X-Feed-Signature": `sha256=${digest}` };
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
      const signature = verifySignedBytes(secret(), req.headers, raw, receivedMs);
      if (!signature.ok) throw new ApiError(401, `feed signature refused: ${signature.reason}`);
      const { source, externalId } = await ctx.params;
      const file = singleFile(await parseMultipart(raw, req.headers.get("content-type")), skymapFileField);
      const answer = await uploadSkymap({
        target: { source: decodeURIComponent(source), externalId: decodeURIComponent(externalId) },
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
