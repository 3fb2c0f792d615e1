import { getDb, type Tx } from "@/db";
import type { PagingPreferences } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { observedSiteIds, readSavedPreferences, readSavedPreferencesMany, writePreferences } from "@/lib/data/paging-people";
import { loadSites } from "@/lib/data/review";
import { onCallPrimaryUntil } from "@/lib/data/rota";
import type { PreferencesInput } from "@/lib/validations/paging";

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
  const saved = await readSavedPreferences(q, userId);
  if (saved) return { ...defaultPreferences(), ...saved };
  return defaultPreferences(await observedSiteIds(q, userId));
}

/** Preferences of several people at once (the worker reads them per batch). */
export async function readPreferencesMany(q: Tx, userIds: string[]): Promise<Map<string, PagingPreferences>> {
  const out = new Map<string, PagingPreferences>();
  if (userIds.length === 0) return out;
  for (const [userId, saved] of await readSavedPreferencesMany(q, userIds)) out.set(userId, { ...defaultPreferences(), ...saved });
  for (const id of userIds) if (!out.has(id)) out.set(id, defaultPreferences());
  return out;
}

export interface PreferencesView {
  preferences: PagingPreferences;
  /** ISO end of the person's current shift as on-call primary, or null */
  onCallUntil: string | null;
  timeZone: string;
  sites: Array<{ id: string; code: string; name: string }>;
}

export async function getPreferencesView(user: SessionUser, now = new Date()): Promise<PreferencesView> {
  const db = await getDb();
  const until = await onCallPrimaryUntil(db, user.id, now);
  const allSites = await loadSites(db);
  return { preferences: await readPreferences(db, user.id), onCallUntil: until?.toISOString() ?? null, timeZone: user.timeZone, sites: allSites };
}

/**
 * Saves a person's switches. The on-call primary may not switch off both outside channels during their shift
 * (delivery ignores their quiet hours and switches for pages then anyway; refusing here says so at once).
 */
export async function savePreferences(user: SessionUser, input: PreferencesInput, now = new Date()): Promise<PreferencesView> {
  const db = await getDb();
  const until = await onCallPrimaryUntil(db, user.id, now);
  if (until && !input.push && !input.email) {
    throw new ApiError(422, `you are the on-call primary until ${until.toISOString()}; pages cannot be muted during your shift`, {
      issues: [{ path: "email", message: "keep push or e-mail on while you are on call" }],
      onCallUntil: until.toISOString(),
    });
  }
  const known = new Set((await loadSites(db)).map((s) => s.id));
  const unknown = input.taskSiteIds.filter((id) => !known.has(id));
  if (unknown.length > 0) {
    throw new ApiError(422, `unknown site ${unknown[0]}`, { issues: [{ path: "taskSiteIds", message: "unknown site" }] });
  }
  const preferences: PagingPreferences = { ...input, taskSiteIds: [...new Set(input.taskSiteIds)] };
  await writePreferences(db, user.id, preferences, now);
  return getPreferencesView(user, now);
}
