import { createHmac, timingSafeEqual } from "node:crypto";
import { config, type Config } from "@/lib/env";

export const timestampHeader = "x-feed-timestamp";
export const signatureHeader = "x-feed-signature";

/** How far a signed timestamp may be from the receiver's clock, either way (replay window). */
export const signatureToleranceSeconds = 5 * 60;

export type SignatureCheck = { ok: true } | { ok: false; reason: string };

/**
 * Hex HMAC-SHA256 of "<timestamp>." followed by the raw body (RFC 2104 HMAC over SHA-256). The body is text for
 * JSON posts and bytes for multipart uploads (a binary file is not text); for a UTF-8 body both give one digest.
 */
export function computeFeedSignature(secret: string, timestampSeconds: number | string, rawBody: string | Uint8Array): string {
  return createHmac("sha256", secret).update(`${timestampSeconds}.`).update(rawBody).digest("hex");
}

/** The two headers a poster sends. */
export function signFeedBody(secret: string, rawBody: string | Uint8Array, nowMs: number): Record<string, string> {
  const timestamp = Math.floor(nowMs / 1000);
  return {
    "X-Feed-Timestamp": String(timestamp),
    "X-Feed-Signature": `sha256=${computeFeedSignature(secret, timestamp, rawBody)}`,
  };
}

export type HeaderCheck = { ok: true; timestamp: string; digest: Buffer } | { ok: false; reason: string };

/** The two headers alone (present, well-formed, timestamp inside the window): checked before a body is read. */
export function checkSignatureHeaders(headers: Headers, nowMs: number): HeaderCheck {
  const timestamp = headers.get(timestampHeader);
  const signature = headers.get(signatureHeader);
  if (!timestamp || !signature) return { ok: false, reason: "missing X-Feed-Timestamp or X-Feed-Signature" };
  if (!/^\d{1,12}$/.test(timestamp)) return { ok: false, reason: "X-Feed-Timestamp must be Unix seconds" };
  if (Math.abs(nowMs / 1000 - Number(timestamp)) > signatureToleranceSeconds) {
    return { ok: false, reason: `timestamp is more than ${signatureToleranceSeconds} s from the server clock` };
  }
  const match = /^sha256=([0-9a-f]{64})$/i.exec(signature.trim());
  if (!match?.[1]) return { ok: false, reason: "X-Feed-Signature must be sha256=<64 hex digits>" };
  return { ok: true, timestamp, digest: Buffer.from(match[1], "hex") };
}

/** Checks both headers against the raw body, comparing digests in constant time; `nowMs` is the receiver's clock. */
export function verifyFeedSignature(
  secret: string,
  headers: Headers,
  rawBody: string | Uint8Array,
  nowMs: number,
): SignatureCheck {
  const checked = checkSignatureHeaders(headers, nowMs);
  if (!checked.ok) return checked;
  const expected = Buffer.from(computeFeedSignature(secret, checked.timestamp, rawBody), "hex");
  if (!timingSafeEqual(expected, checked.digest)) return { ok: false, reason: "signature does not match" };
  return { ok: true };
}

/** The secret, checked where it is used, so the feed route needs no other variable to run (tests, scripts). */
export function feedSigningSecret(settings: Pick<Config, "FEED_SIGNING_SECRET"> = config()): string {
  const secret = settings.FEED_SIGNING_SECRET;
  if (!secret) throw new Error("FEED_SIGNING_SECRET must be set (at least 32 characters)");
  return secret;
}
