import { and, count, eq, gte, lt, min } from "drizzle-orm";
import { getDb } from "@/db";
import { signInAttempts } from "@/db/schema";

/** Failed sign-ins allowed per bucket within the window (common practice: a handful per quarter hour). */
export const signInLimits = { windowMs: 15 * 60_000, perAccount: 5, perAddress: 30 } as const;

export const accountBucket = (email: string) => `account:${email.trim().toLowerCase()}`;
export const addressBucket = (address: string) => `address:${address}`;

/** Seconds until the caller may try again, or 0 when neither bucket is full. */
export async function signInRetryAfterSeconds(email: string, address: string, now = new Date()): Promise<number> {
  const db = await getDb();
  const since = new Date(now.getTime() - signInLimits.windowMs);
  const buckets: Array<[string, number]> = [
    [accountBucket(email), signInLimits.perAccount],
    [addressBucket(address), signInLimits.perAddress],
  ];
  let retryAfter = 0;
  for (const [bucket, limit] of buckets) {
    const [row] = await db
      .select({ n: count(), oldest: min(signInAttempts.at) })
      .from(signInAttempts)
      .where(and(eq(signInAttempts.bucket, bucket), gte(signInAttempts.at, since)));
    if (row && row.n >= limit) {
      const freesAt = (row.oldest?.getTime() ?? now.getTime()) + signInLimits.windowMs;
      retryAfter = Math.max(retryAfter, Math.ceil((freesAt - now.getTime()) / 1000));
    }
  }
  return retryAfter;
}

export async function recordFailedSignIn(email: string, address: string, now = new Date()): Promise<void> {
  const db = await getDb();
  await db.insert(signInAttempts).values([
    { bucket: accountBucket(email), at: now },
    { bucket: addressBucket(address), at: now },
  ]);
  // Old rows are of no further use; prune a little on each write.
  await db.delete(signInAttempts).where(lt(signInAttempts.at, new Date(now.getTime() - 2 * signInLimits.windowMs)));
}

export async function clearAccountFailures(email: string): Promise<void> {
  const db = await getDb();
  await db.delete(signInAttempts).where(eq(signInAttempts.bucket, accountBucket(email)));
}

/** The caller's address as the nearest proxy reports it; "local" when there is none. */
export function clientAddress(headers: Headers): string {
  const forwarded = headers.get("x-forwarded-for")?.split(",")[0]?.trim();
  return forwarded || headers.get("x-real-ip") || "local";
}
