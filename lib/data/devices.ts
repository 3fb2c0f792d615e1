import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { pushSubscriptions } from "@/db/schema";

/* A person's browsers subscribed to Web Push (RFC 8030): endpoint and keys as the browser gave them. */

export type DeviceRow = typeof pushSubscriptions.$inferSelect;

export async function listDeviceRows(userId: string): Promise<DeviceRow[]> {
  const db = await getDb();
  return db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId)).orderBy(asc(pushSubscriptions.createdAt));
}

/** Stores a subscription; an endpoint seen before (same browser, maybe another person) is taken over. */
export async function upsertDevice(
  values: { userId: string; endpoint: string; p256dh: string; auth: string; label: string },
  now: Date,
): Promise<DeviceRow> {
  const db = await getDb();
  const [row] = await db
    .insert(pushSubscriptions)
    .values({ ...values, createdAt: now })
    .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: values })
    .returning();
  if (!row) throw new Error("subscription upsert returned nothing");
  return row;
}

/** Removes one of the person's subscriptions, by id or endpoint; returns how many went. */
export async function deleteDevice(userId: string, by: { id: string } | { endpoint: string }): Promise<number> {
  const db = await getDb();
  const match = "id" in by ? eq(pushSubscriptions.id, by.id) : eq(pushSubscriptions.endpoint, by.endpoint);
  const gone = await db.delete(pushSubscriptions).where(and(match, eq(pushSubscriptions.userId, userId))).returning({ id: pushSubscriptions.id });
  return gone.length;
}

/** Every subscription of one person (the push channel sends to each). */
export async function devicesOfUser(userId: string): Promise<DeviceRow[]> {
  const db = await getDb();
  return db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
}

export async function markDeviceReached(deviceId: string, at: Date): Promise<void> {
  const db = await getDb();
  await db.update(pushSubscriptions).set({ lastSuccessAt: at }).where(eq(pushSubscriptions.id, deviceId));
}

/** Forgets a subscription the push service says is gone (404/410). */
export async function forgetDevice(deviceId: string): Promise<void> {
  const db = await getDb();
  await db.delete(pushSubscriptions).where(eq(pushSubscriptions.id, deviceId));
}
