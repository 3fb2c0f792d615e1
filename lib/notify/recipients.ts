import type { Shift } from "@/db/schema";
import type { Tx } from "@/db";
import { activeCoordinators, activeObserversOf, activeUsersByIds, listSavedPreferences, type Recipient } from "@/lib/data/paging-people";
import type { EscalationTarget } from "@/lib/validations/paging";

export type { Recipient } from "@/lib/data/paging-people";

export const coordinators = (tx: Tx): Promise<Recipient[]> => activeCoordinators(tx);

/** Who an escalation step reaches, given the shift that covered the candidate's receipt (or none). */
export async function resolveTarget(tx: Tx, target: EscalationTarget, shift: Shift | null): Promise<Recipient[]> {
  if (target === "primary") return activeUsersByIds(tx, [shift?.primaryId]);
  if (target === "backup") return activeUsersByIds(tx, [shift?.backupId]);
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
  const saved = await listSavedPreferences(tx);
  const withPrefs = new Set(saved.map((p) => p.userId));
  for (const p of saved) {
    for (const siteId of p.preferences.taskSiteIds ?? []) out.get(siteId)?.push(p.userId);
  }
  const defaults = await activeObserversOf(tx, siteIds);
  for (const d of defaults) if (!withPrefs.has(d.userId)) out.get(d.siteId)?.push(d.userId);
  return out;
}
