import { and, count, eq, gte, inArray, lt, min } from "drizzle-orm";
import { getDb } from "@/db";
import { signInAttempts, users, type User } from "@/db/schema";

/* Sign-in's storage: a person's row by id or e-mail, and the failed-attempt log the rate limit counts. */

export async function findUserById(userId: string): Promise<User | null> {
  const db = await getDb();
  const [row] = await db.select().from(users).where(eq(users.id, userId)).limit(1);
  return row ?? null;
}

export async function findUserByEmail(email: string): Promise<User | null> {
  const db = await getDb();
  const [row] = await db.select().from(users).where(eq(users.email, email)).limit(1);
  return row ?? null;
}

/** Per bucket: failures since `since` and the oldest of them. */
export async function countFailures(buckets: string[], since: Date): Promise<Array<{ bucket: string; n: number; oldest: Date | null }>> {
  const db = await getDb();
  return db
    .select({ bucket: signInAttempts.bucket, n: count(), oldest: min(signInAttempts.at) })
    .from(signInAttempts)
    .where(and(inArray(signInAttempts.bucket, buckets), gte(signInAttempts.at, since)))
    .groupBy(signInAttempts.bucket);
}

/** Records one failure in each bucket, then prunes rows older than `pruneBefore`. */
export async function recordFailures(buckets: string[], now: Date, pruneBefore: Date): Promise<void> {
  const db = await getDb();
  await db.insert(signInAttempts).values(buckets.map((bucket) => ({ bucket, at: now })));
  await db.delete(signInAttempts).where(lt(signInAttempts.at, pruneBefore));
}

export async function clearFailures(bucket: string): Promise<void> {
  const db = await getDb();
  await db.delete(signInAttempts).where(eq(signInAttempts.bucket, bucket));
}
