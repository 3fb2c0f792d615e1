import { asc, desc, gt } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { events, type AppEvent, type NewAppEvent } from "@/db/schema";

/** Appends to the audit/event log (never updated, never deleted) and returns the stored row with its id. */
export async function appendEvent(tx: Tx, event: Omit<NewAppEvent, "id" | "at"> & { at?: Date }): Promise<AppEvent> {
  const [row] = await tx
    .insert(events)
    .values({ ...event, at: event.at ?? new Date() })
    .returning();
  if (!row) throw new Error("event insert returned nothing");
  return row;
}

/** Events after `afterId`, oldest first: the live stream's resume read. */
export async function listEventsAfter(afterId: number, limit = 500): Promise<AppEvent[]> {
  const db = await getDb();
  return db.select().from(events).where(gt(events.id, afterId)).orderBy(asc(events.id)).limit(limit);
}

export async function latestEventId(): Promise<number> {
  const db = await getDb();
  const [row] = await db.select({ id: events.id }).from(events).orderBy(desc(events.id)).limit(1);
  return row?.id ?? 0;
}
