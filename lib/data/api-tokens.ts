import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db";
import { apiTokens, users, type User } from "@/db/schema";

export interface NewApiTokenRow {
  userId: string;
  label: string;
  tokenHash: string;
  prefix: string;
}

/** Stores a token's hash and shown prefix; returns the new row's id. */
export async function insertApiToken(values: NewApiTokenRow): Promise<string> {
  const db = await getDb();
  const [row] = await db.insert(apiTokens).values(values).returning({ id: apiTokens.id });
  if (!row) throw new Error("token insert returned nothing");
  return row.id;
}

/** The person's tokens, oldest first, without their hashes. */
export async function listApiTokensOf(userId: string) {
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

/** Marks one of the person's live tokens revoked; false when there is no such live token. */
export async function markApiTokenRevoked(userId: string, tokenId: string, now: Date): Promise<boolean> {
  const db = await getDb();
  const rows = await db
    .update(apiTokens)
    .set({ revokedAt: now })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id });
  return rows.length > 0;
}

export interface ApiTokenOwnerRow {
  tokenId: string;
  tokenHash: string;
  revokedAt: Date | null;
  user: User;
}

/** The token with this hash and its owner, or null. */
export async function findApiTokenByHash(tokenHash: string): Promise<ApiTokenOwnerRow | null> {
  const db = await getDb();
  const [row] = await db
    .select({ tokenId: apiTokens.id, tokenHash: apiTokens.tokenHash, revokedAt: apiTokens.revokedAt, user: users })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.tokenHash, tokenHash))
    .limit(1);
  return row ?? null;
}

/** Records when a token was last used. */
export async function touchApiToken(tokenId: string, now: Date): Promise<void> {
  const db = await getDb();
  await db.update(apiTokens).set({ lastUsedAt: now }).where(eq(apiTokens.id, tokenId));
}
