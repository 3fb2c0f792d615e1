// Push-service side of VAPID (RFC 8292): parse `Authorization: vapid t=<JWT>, k=<key>`, check the
// ES256 signature with node:crypto and the claims a push service must enforce.
import { createPublicKey, verify } from "node:crypto";
import type { KeyObject } from "node:crypto";

const MAX_EXPIRY_AHEAD_SECONDS = 24 * 60 * 60;

export interface VapidClaims {
  aud: string;
  exp: number;
  sub: string;
}

export type VapidCheck =
  | { ok: true; publicKey: string; claims: VapidClaims }
  | { ok: false; status: 401 | 403; reason: string };

const refuse = (status: 401 | 403, reason: string): VapidCheck => ({ ok: false, status, reason });

/** Splits `vapid t=..., k=...` into its auth-params (RFC 8292 Section 3; RFC 7235 Section 2.1 syntax). */
export function parseVapidAuthorization(header: string | undefined): { token: string; key: string } | null {
  if (!header) return null;
  const match = /^vapid\s+(.+)$/i.exec(header.trim());
  if (!match?.[1]) return null;
  const params = new Map<string, string>();
  for (const part of match[1].split(",")) {
    const eq = part.indexOf("=");
    if (eq < 0) return null;
    const value = part.slice(eq + 1).trim().replace(/^"(.*)"$/, "$1");
    params.set(part.slice(0, eq).trim().toLowerCase(), value);
  }
  const token = params.get("t");
  const key = params.get("k");
  return token && key ? { token, key } : null;
}

/** Builds a KeyObject from an uncompressed P-256 point (0x04 || X || Y), as carried in `k`. */
export function p256PublicKeyFromRaw(raw: Buffer): KeyObject | null {
  if (raw.length !== 65 || raw[0] !== 0x04) return null;
  try {
    return createPublicKey({
      key: {
        kty: "EC",
        crv: "P-256",
        x: raw.subarray(1, 33).toString("base64url"),
        y: raw.subarray(33).toString("base64url"),
      },
      format: "jwk",
    });
  } catch {
    return null; // not a point on the curve
  }
}

function decodeJsonSegment(segment: string): Record<string, unknown> | null {
  try {
    const value: unknown = JSON.parse(Buffer.from(segment, "base64url").toString("utf8"));
    return value !== null && typeof value === "object" && !Array.isArray(value)
      ? (value as Record<string, unknown>)
      : null;
  } catch {
    return null;
  }
}

export interface VapidExpectations {
  /** Origin of the push resource the request was sent to, e.g. `http://127.0.0.1:4010`. */
  audience: string;
  nowMs: number;
  /** For a restricted subscription (RFC 8292 Section 4), the applicationServerKey it was created with. */
  requiredPublicKey?: string;
}

/**
 * Verifies a VAPID Authorization header. Missing or unparseable credentials answer 401, credentials that
 * parse but fail (signature, claims, key mismatch) answer 403 — RFC 8292 Sections 2, 3 and 4.2.
 */
export function verifyVapid(header: string | undefined, expect: VapidExpectations): VapidCheck {
  const parsed = parseVapidAuthorization(header);
  if (!parsed) return refuse(401, "missing or malformed vapid Authorization (want: vapid t=<JWT>, k=<key>)");
  const keyBytes = Buffer.from(parsed.key, "base64url");
  const publicKey = p256PublicKeyFromRaw(keyBytes);
  if (!publicKey) return refuse(401, "k is not an uncompressed P-256 public key");
  const segments = parsed.token.split(".");
  if (segments.length !== 3) return refuse(401, "t is not a compact JWS");
  const [headerSegment = "", payloadSegment = "", signatureSegment = ""] = segments;
  const jwtHeader = decodeJsonSegment(headerSegment);
  const claims = decodeJsonSegment(payloadSegment);
  if (!jwtHeader || !claims) return refuse(401, "JWT header or claims are not JSON objects");

  if (jwtHeader.alg !== "ES256") return refuse(403, `JWT alg must be ES256, got ${String(jwtHeader.alg)}`);
  // ES256 signatures are the 64-byte R || S form of RFC 7518 Section 3.4, not DER.
  const signature = Buffer.from(signatureSegment, "base64url");
  if (signature.length !== 64) return refuse(403, "ES256 signature must be 64 bytes");
  const signingInput = Buffer.from(`${headerSegment}.${payloadSegment}`, "ascii");
  if (!verify("sha256", signingInput, { key: publicKey, dsaEncoding: "ieee-p1363" }, signature)) {
    return refuse(403, "JWT signature does not verify with k");
  }
  if (expect.requiredPublicKey && Buffer.compare(keyBytes, Buffer.from(expect.requiredPublicKey, "base64url")) !== 0) {
    return refuse(403, "k differs from the applicationServerKey of this subscription");
  }

  const { aud, exp, sub } = claims;
  if (aud !== expect.audience) return refuse(403, `aud ${JSON.stringify(aud)} is not ${expect.audience}`);
  if (typeof exp !== "number" || !Number.isInteger(exp)) return refuse(403, "exp must be an integer");
  const nowSeconds = Math.floor(expect.nowMs / 1000);
  if (exp <= nowSeconds) return refuse(403, "JWT has expired");
  if (exp > nowSeconds + MAX_EXPIRY_AHEAD_SECONDS) return refuse(403, "exp is more than 24 hours ahead");
  if (typeof sub !== "string" || !/^(mailto:|https:)/.test(sub)) return refuse(403, "sub must be a mailto: or https: URI");

  return { ok: true, publicKey: parsed.key, claims: { aud, exp, sub } };
}
