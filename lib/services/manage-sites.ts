import { getDb, type Tx } from "@/db";
import type { Site } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { insertInstrument } from "@/lib/data/instruments";
import { deleteSiteRow, existingUserIds, findSiteIdByCode, findSiteRow, getSite, insertSite, replaceSiteObservers, updateSiteRow, type SiteRecord } from "@/lib/data/sites";
import { eventKinds } from "@/lib/events/kinds";
import type { SiteInput } from "@/lib/validations/sites";

/**
 * Coordinators' site changes: each opens one write transaction, checks the rules (a free code, known observers),
 * writes through storage and appends the audit event, so nothing is stored half-written.
 */

async function checkCodeFree(tx: Tx, code: string, exceptId?: string): Promise<void> {
  if ((await findSiteIdByCode(tx, code, exceptId)) !== null) {
    throw new ApiError(409, `another site already uses the code ${code}`, { issues: [{ path: "code", message: "already used" }] });
  }
}

async function setObservers(tx: Tx, siteId: string, observerIds: string[]): Promise<void> {
  const wanted = [...new Set(observerIds)];
  const known = new Set(await existingUserIds(tx, wanted));
  const missing = wanted.filter((id) => !known.has(id));
  if (missing.length) throw new ApiError(422, `unknown observer: ${missing.join(", ")}`, { issues: [{ path: "observerIds", message: "unknown person" }] });
  await replaceSiteObservers(tx, siteId, wanted);
}

type SiteFields = Omit<SiteInput, "observerIds">;

/** The stored fields a save changed, with their values before and after, for the audit log. */
function changedFields(before: Site, after: SiteFields) {
  const changed = (Object.keys(after) as Array<keyof SiteFields>).filter((k) => before[k] !== after[k]);
  return {
    changed,
    before: Object.fromEntries(changed.map((k) => [k, before[k]])),
    after: Object.fromEntries(changed.map((k) => [k, after[k]])),
  };
}

export async function createSite(actor: SessionUser, input: SiteInput, now: Date = new Date()): Promise<SiteRecord> {
  const db = await getDb();
  const { observerIds, ...fields } = input;
  const id = await db.transaction(async (tx) => {
    await checkCodeFree(tx, fields.code);
    const siteId = await insertSite(tx, { ...fields, createdAt: now });
    // A new site starts with one square instrument of the field it was given; coordinators edit it on the sites page.
    const sideDeg = Math.sqrt(fields.fieldOfViewDeg2);
    await insertInstrument(tx, siteId, { name: "Main camera", footprint: { shape: "rectangle", widthDeg: sideDeg, heightDeg: sideDeg }, filters: [], exposureS: 60, overheadS: 30, limitingMag: null }, now);
    await setObservers(tx, siteId, observerIds);
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId, code: fields.code, action: "created", after: fields } });
    return siteId;
  });
  return getSite(id);
}

/** Replaces every field (the form always sends them all), observers included. */
export async function updateSite(actor: SessionUser, id: string, input: SiteInput, now: Date = new Date()): Promise<SiteRecord> {
  const db = await getDb();
  const { observerIds, ...fields } = input;
  await db.transaction(async (tx) => {
    const before = await findSiteRow(tx, id);
    if (!before) throw new ApiError(404, "site not found");
    await checkCodeFree(tx, fields.code, id);
    await updateSiteRow(tx, id, fields);
    await setObservers(tx, id, observerIds);
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId: id, code: fields.code, action: "updated", ...changedFields(before, fields) } });
  });
  return getSite(id);
}

/** Deletes a site; its tasks keep existing without a site (the foreign key sets null). */
export async function deleteSite(actor: SessionUser, id: string, now: Date = new Date()): Promise<void> {
  const db = await getDb();
  await db.transaction(async (tx) => {
    const code = await deleteSiteRow(tx, id);
    if (code === null) throw new ApiError(404, "site not found");
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId: id, code, action: "deleted" } });
  });
}
