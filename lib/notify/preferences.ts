import { eq, inArray } from "drizzle-orm";
import { notificationPreferences, siteObservers, type PagingPreferences } from "@/db/schema";
import type { Tx } from "@/lib/data/events";

export const defaultPreferences = (taskSiteIds: string[] = []): PagingPreferences => ({
  push: true,
  email: true,
  quietStart: null,
  quietEnd: null,
  taskSiteIds,
  taskChannels: { push: true, email: true },
});

/** Saved preferences, or the defaults (task sites: the sites the person observes at). */
export async function readPreferences(q: Tx, userId: string): Promise<PagingPreferences> {
  const [row] = await q.select().from(notificationPreferences).where(eq(notificationPreferences.userId, userId)).limit(1);
  if (row) return { ...defaultPreferences(), ...row.preferences };
  const sites = await q.select({ siteId: siteObservers.siteId }).from(siteObservers).where(eq(siteObservers.userId, userId));
  return defaultPreferences(sites.map((s) => s.siteId));
}

/** Preferences of several people at once (the worker reads them per batch). */
export async function readPreferencesMany(q: Tx, userIds: string[]): Promise<Map<string, PagingPreferences>> {
  const out = new Map<string, PagingPreferences>();
  if (userIds.length === 0) return out;
  const rows = await q.select().from(notificationPreferences).where(inArray(notificationPreferences.userId, userIds));
  for (const row of rows) out.set(row.userId, { ...defaultPreferences(), ...row.preferences });
  for (const id of userIds) if (!out.has(id)) out.set(id, defaultPreferences());
  return out;
}
