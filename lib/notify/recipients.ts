import { and, eq, inArray, isNull } from "drizzle-orm";
import { notificationPreferences, siteObservers, users, type Shift } from "@/db/schema";
import type { Tx } from "@/db";
import type { EscalationTarget } from "@/lib/validations/paging";

export interface Recipient {
  id: string;
  name: string;
  timeZone: string;
}

const active = (ids: string[]) => and(inArray(users.id, ids), isNull(users.disabledAt));

async function usersByIds(tx: Tx, ids: Array<string | null | undefined>): Promise<Recipient[]> {
  const wanted = ids.filter((id): id is string => typeof id === "string");
  if (wanted.length === 0) return [];
  return tx.select({ id: users.id, name: users.name, timeZone: users.timeZone }).from(users).where(active(wanted));
}

export async function coordinators(tx: Tx): Promise<Recipient[]> {
  return tx
    .select({ id: users.id, name: users.name, timeZone: users.timeZone })
    .from(users)
    .where(and(eq(users.role, "coordinator"), isNull(users.disabledAt)));
}

/** Who an escalation step reaches, given the shift that covered the candidate's receipt (or none). */
export async function resolveTarget(tx: Tx, target: EscalationTarget, shift: Shift | null): Promise<Recipient[]> {
  if (target === "primary") return usersByIds(tx, [shift?.primaryId]);
  if (target === "backup") return usersByIds(tx, [shift?.backupId]);
  return coordinators(tx);
}

export const targetRoleLabel: Record<EscalationTarget, string> = {
  primary: "on-call primary",
  backup: "on-call backup",
  coordinators: "coordinator",
};

/**
 * People who want to hear about tasks at each site: those whose saved preferences list the site, and, for people
 * who never saved preferences, the site's observers.
 */
export async function taskListenersBySite(tx: Tx, siteIds: string[]): Promise<Map<string, string[]>> {
  const out = new Map<string, string[]>(siteIds.map((id) => [id, []]));
  if (siteIds.length === 0) return out;
  const saved = await tx.select().from(notificationPreferences);
  const withPrefs = new Set(saved.map((p) => p.userId));
  for (const p of saved) {
    for (const siteId of p.preferences.taskSiteIds ?? []) out.get(siteId)?.push(p.userId);
  }
  const defaults = await tx
    .select({ siteId: siteObservers.siteId, userId: siteObservers.userId })
    .from(siteObservers)
    .innerJoin(users, eq(users.id, siteObservers.userId))
    .where(and(inArray(siteObservers.siteId, siteIds), isNull(users.disabledAt)));
  for (const d of defaults) if (!withPrefs.has(d.userId)) out.get(d.siteId)?.push(d.userId);
  return out;
}
