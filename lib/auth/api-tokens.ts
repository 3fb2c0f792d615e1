import { createHash, randomBytes, timingSafeEqual } from "node:crypto";
import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db";
import { apiTokens, users } from "@/db/schema";
import type { SessionUser } from "./roles";

const TOKEN_PREFIX = "cdk_";

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/** Makes a token and stores only its hash; the token itself is returned once. */
export async function createApiToken(userId: string, label: string): Promise<{ id: string; token: string }> {
  const token = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  const db = await getDb();
  const [row] = await db
    .insert(apiTokens)
    .values({ userId, label, tokenHash: hashToken(token), prefix: token.slice(0, TOKEN_PREFIX.length + 6) })
    .returning({ id: apiTokens.id });
  if (!row) throw new Error("token insert returned nothing");
  return { id: row.id, token };
}

export async function listApiTokens(userId: string) {
  const db = await getDb();
  return db
    .select({
      id: apiTokens.id,
      label: apiTokens.label,
      prefix: apiTokens.prefix,
      createdAt: apiTokens.createdAt,
      lastUsedAt: apiTokens.lastUsedAt,
      revokedAt: apiTokens.revokedAt,
    })
    .from(apiTokens)
    .where(eq(apiTokens.userId, userId))
    .orderBy(apiTokens.createdAt);
}

/** Revokes one of the user's own tokens; false when there is no such live token. */
export async function revokeApiToken(userId: string, tokenId: string, now = new Date()): Promise<boolean> {
  const db = await getDb();
  const rows = await db
    .update(apiTokens)
    .set({ revokedAt: now })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id });
  return rows.length > 0;
}

/** Resolves a bearer token to its live, enabled owner, comparing hashes in constant time. */
export async function resolveApiToken(token: string, now = new Date()): Promise<SessionUser | null> {
  if (!token.startsWith(TOKEN_PREFIX) || token.length > 200) return null;
  const hash = hashToken(token);
  const db = await getDb();
  const [row] = await db
    .select({ tokenId: apiTokens.id, tokenHash: apiTokens.tokenHash, revokedAt: apiTokens.revokedAt, user: users })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.tokenHash, hash))
    .limit(1);
  if (!row || row.revokedAt || row.user.disabledAt) return null;
  if (!timingSafeEqual(Buffer.from(row.tokenHash, "hex"), Buffer.from(hash, "hex"))) return null;
  await db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, row.tokenId));
  const { id, email, name, role, timeZone, initials } = row.user;
  return { id, email, name, role, timeZone, initials };
}
