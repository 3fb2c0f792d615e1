import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { pushSubscriptions } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { PushSubscribeInput } from "@/lib/validations/paging";

export interface DeviceView {
  id: string;
  label: string;
  /** the push service's host only; the endpoint itself is a capability URL and stays on the server */
  service: string;
  createdAt: string;
  lastSuccessAt: string | null;
}

const view = (row: typeof pushSubscriptions.$inferSelect): DeviceView => ({
  id: row.id,
  label: row.label,
  service: (() => {
    try {
      return new URL(row.endpoint).host;
    } catch {
      return "unknown";
    }
  })(),
  createdAt: row.createdAt.toISOString(),
  lastSuccessAt: row.lastSuccessAt?.toISOString() ?? null,
});

export async function listDevices(userId: string): Promise<DeviceView[]> {
  const db = await getDb();
  const rows = await db.select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId)).orderBy(asc(pushSubscriptions.createdAt));
  return rows.map(view);
}

/** Stores this browser's subscription; an endpoint seen before (same browser, maybe another person) is taken over. */
export async function subscribeDevice(userId: string, input: PushSubscribeInput, now = new Date()): Promise<DeviceView> {
  const db = await getDb();
  const values = { userId, endpoint: input.endpoint, p256dh: input.keys.p256dh, auth: input.keys.auth, label: input.label };
  const [row] = await db
      .insert(pushSubscriptions)
      .values({ ...values, createdAt: now })
      .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: values })
      .returning();
  if (!row) throw new Error("subscription upsert returned nothing");
  return view(row);
}

export async function removeDevice(userId: string, by: { id: string } | { endpoint: string }): Promise<void> {
  const db = await getDb();
  const match = "id" in by ? eq(pushSubscriptions.id, by.id) : eq(pushSubscriptions.endpoint, by.endpoint);
  const gone = await db.delete(pushSubscriptions).where(and(match, eq(pushSubscriptions.userId, userId))).returning({ id: pushSubscriptions.id });
  if (gone.length === 0) throw new ApiError(404, "no such device of yours");
}
