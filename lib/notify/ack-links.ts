import { createHmac, randomUUID, timingSafeEqual } from "node:crypto";
import type { ackTokens } from "@/db/schema";
import type { Tx } from "@/db";
import { readAckToken } from "@/lib/data/outbox";
import { config, type Config } from "@/lib/env";

/** How long a one-click acknowledge link works. */
export const ackLinkLifetimeMs = 2 * 60 * 60_000;

export interface AckClaims {
  id: string;
  candidateId: string;
  userId: string;
  expiresAtMs: number;
}

/** The link secret, or null when unset (then pages go out without an acknowledge link rather than not at all). */
export function ackLinkSecret(settings: Pick<Config, "ACK_LINK_SECRET"> = config()): string | null {
  return settings.ACK_LINK_SECRET ?? null;
}

function mac(secret: string, c: AckClaims): Buffer {
  return createHmac("sha256", secret).update(`chirpdesk-ack/v1|${c.id}|${c.candidateId}|${c.userId}|${c.expiresAtMs}`).digest();
}

/** `<token id>.<expiry, base-36 ms>.<base64url HMAC-SHA256 over id, candidate, user and expiry>` (RFC 2104). */
export function signAckToken(claims: AckClaims, secret: string): string {
  return `${claims.id}.${claims.expiresAtMs.toString(36)}.${mac(secret, claims).toString("base64url")}`;
}

export interface ParsedAckToken {
  id: string;
  expiresAtMs: number;
  signature: Buffer;
}

export function parseAckToken(token: string): ParsedAckToken | null {
  const m = /^([0-9a-f-]{36})\.([0-9a-z]{1,12})\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!m?.[1] || !m[2] || !m[3]) return null;
  return { id: m[1], expiresAtMs: parseInt(m[2], 36), signature: Buffer.from(m[3], "base64url") };
}

/** A new signed token and the single-use row the caller stores for it (in the transaction that sends it). */
export function mintAckToken(
  input: { candidateId: string; userId: string; now: Date },
  secret: string,
): { token: string; expiresAt: Date; row: typeof ackTokens.$inferInsert } {
  const claims: AckClaims = {
    id: randomUUID(),
    candidateId: input.candidateId,
    userId: input.userId,
    expiresAtMs: input.now.getTime() + ackLinkLifetimeMs,
  };
  const expiresAt = new Date(claims.expiresAtMs);
  const row = { id: claims.id, candidateId: claims.candidateId, userId: claims.userId, expiresAt, createdAt: input.now };
  return { token: signAckToken(claims, secret), expiresAt, row };
}

export type AckTokenCheck =
  | { ok: true; claims: AckClaims; usedAt: Date | null }
  | { ok: false; reason: "forged" }
  | { ok: false; reason: "expired"; claims: AckClaims };

/**
 * Checks the signature against the stored row (whose candidate and user the signature covers) and the expiry.
 * A used token still verifies; whether it was used is the caller's question (`usedAt`).
 */
export async function verifyAckToken(q: Tx, token: string, now: Date, secret: string): Promise<AckTokenCheck> {
  const parsed = parseAckToken(token);
  if (!parsed) return { ok: false, reason: "forged" };
  const row = await readAckToken(q, parsed.id);
  if (!row) return { ok: false, reason: "forged" };
  const claims: AckClaims = { id: row.id, candidateId: row.candidateId, userId: row.userId, expiresAtMs: parsed.expiresAtMs };
  const expected = mac(secret, claims);
  if (expected.length !== parsed.signature.length || !timingSafeEqual(expected, parsed.signature)) {
    return { ok: false, reason: "forged" };
  }
  if (row.expiresAt.getTime() !== parsed.expiresAtMs) return { ok: false, reason: "forged" };
  if (now.getTime() >= parsed.expiresAtMs) return { ok: false, reason: "expired", claims };
  return { ok: true, claims, usedAt: row.usedAt };
}
