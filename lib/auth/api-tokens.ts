import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import { findApiTokenByHash, insertApiToken, listApiTokensOf, markApiTokenRevoked, touchApiToken } from "@/lib/data/api-tokens";
import type { SessionUser } from "./roles";

const TOKEN_PREFIX = "cdk_";

/**
 * When a token was last used is a convenience for its owner's token list, never worth delaying or failing a request
 * (a bearer read must not fail because the database is busy): it is recorded at most once a minute per token, not
 * awaited, and a failure is dropped (the next use records it).
 */
const RECORD_USE_EVERY_MS = 60_000;
const useRecordedAt = new Map<string, number>();

function recordUse(tokenId: string, now: Date): void {
  const last = useRecordedAt.get(tokenId);
  if (last !== undefined && Math.abs(now.getTime() - last) < RECORD_USE_EVERY_MS) return;
  useRecordedAt.set(tokenId, now.getTime());
  touchApiToken(tokenId, now).catch(() => useRecordedAt.delete(tokenId));
}

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** Makes a token and stores only its hash; the token itself is returned once. */
export async function createApiToken(userId: string, label: string): Promise<{ id: string; token: string }> {
  const token = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  const id = await insertApiToken({ userId, label, tokenHash: hashToken(token), prefix: token.slice(0, TOKEN_PREFIX.length + 6) });
  return { id, token };
}

export function listApiTokens(userId: string) {
  return listApiTokensOf(userId);
}

/** Revokes one of the user's own tokens; false when there is no such live token. */
export function revokeApiToken(userId: string, tokenId: string, now = new Date()): Promise<boolean> {
  return markApiTokenRevoked(userId, tokenId, now);
}

/** Resolves a bearer token to its live, enabled owner, comparing hashes in constant time. */
export async function resolveApiToken(token: string, now = new Date()): Promise<SessionUser | null> {
  if (!token.startsWith(TOKEN_PREFIX) || token.length > 200) return null;
  const hash = hashToken(token);
  const row = await findApiTokenByHash(hash);
  if (!row || row.revokedAt || row.user.disabledAt) return null;
  if (!timingSafeEqual(Buffer.from(row.tokenHash, "hex"), Buffer.from(hash, "hex"))) return null;
  recordUse(row.tokenId, now);
  const { id, email, name, role, timeZone, initials } = row.user;
  return { id, email, name, role, timeZone, initials };
}
