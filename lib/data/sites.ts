import { and, asc, eq, inArray, isNull, ne } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { instruments, siteObservers, sites, users, type Site } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import type { SiteInput } from "@/lib/validations/sites";
import { appendEvent } from "./events";

export interface SiteObserver {
  id: string;
  name: string;
  initials: string;
}

export interface SiteRecord {
  id: string;
  code: string;
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number;
  minAltitudeDeg: number;
  fieldOfViewDeg2: number;
  timeZone: string;
  createdAt: string;
  observers: SiteObserver[];
}

function toRecord(site: Site, observers: SiteObserver[]): SiteRecord {
  return {
    id: site.id,
    code: site.code,
    name: site.name,
    latitudeDeg: site.latitudeDeg,
    longitudeDeg: site.longitudeDeg,
    elevationM: site.elevationM,
    minAltitudeDeg: site.minAltitudeDeg,
    fieldOfViewDeg2: site.fieldOfViewDeg2,
    timeZone: site.timeZone,
    createdAt: site.createdAt.toISOString(),
    observers,
  };
}

/** Every site (or the one with `onlyId`) with the people who observe there, by code. */
export async function listSites(onlyId?: string): Promise<SiteRecord[]> {
  const db = await getDb();
  const rows = await db
    .select()
    .from(sites)
    .where(onlyId === undefined ? undefined : eq(sites.id, onlyId))
    .orderBy(asc(sites.code));
  if (rows.length === 0) return [];
  const links = await db
    .select({ siteId: siteObservers.siteId, id: users.id, name: users.name, initials: users.initials })
    .from(siteObservers)
    .innerJoin(users, eq(users.id, siteObservers.userId))
    .where(onlyId === undefined ? undefined : eq(siteObservers.siteId, onlyId))
    .orderBy(asc(users.name));
  return rows.map((site) =>
    toRecord(
      site,
      links.filter((l) => l.siteId === site.id).map(({ id, name, initials }) => ({ id, name, initials })),
    ),
  );
}

export async function getSite(id: string): Promise<SiteRecord> {
  const [found] = await listSites(id);
  if (!found) throw new ApiError(404, "site not found");
  return found;
}

/** People who may be listed as a site's observers: enabled observers and coordinators. */
export async function listObserverOptions(): Promise<SiteObserver[]> {
  const db = await getDb();
  return db
    .select({ id: users.id, name: users.name, initials: users.initials })
    .from(users)
    .where(and(inArray(users.role, ["observer", "coordinator"]), isNull(users.disabledAt)))
    .orderBy(asc(users.name));
}

async function checkCodeFree(tx: Tx, code: string, exceptId?: string): Promise<void> {
  const where = exceptId ? and(eq(sites.code, code), ne(sites.id, exceptId)) : eq(sites.code, code);
  const [taken] = await tx.select({ id: sites.id }).from(sites).where(where).limit(1);
  if (taken) throw new ApiError(409, `another site already uses the code ${code}`, { issues: [{ path: "code", message: "already used" }] });
}

async function setObservers(tx: Tx, siteId: string, observerIds: string[]): Promise<void> {
  const wanted = [...new Set(observerIds)];
  if (wanted.length) {
    const known = await tx.select({ id: users.id }).from(users).where(inArray(users.id, wanted));
    const missing = wanted.filter((id) => !known.some((k) => k.id === id));
    if (missing.length) {
      throw new ApiError(422, `unknown observer: ${missing.join(", ")}`, { issues: [{ path: "observerIds", message: "unknown person" }] });
    }
  }
  await tx.delete(siteObservers).where(eq(siteObservers.siteId, siteId));
  if (wanted.length) await tx.insert(siteObservers).values(wanted.map((userId) => ({ siteId, userId })));
}

export async function createSite(actor: SessionUser, input: SiteInput, now: Date = new Date()): Promise<SiteRecord> {
  const db = await getDb();
  const { observerIds, ...fields } = input;
  const id = await db.transaction(async (tx) => {
    await checkCodeFree(tx, fields.code);
    const [row] = await tx.insert(sites).values({ ...fields, createdAt: now }).returning({ id: sites.id });
    if (!row) throw new Error("site insert returned nothing");
    // A new site starts with one square instrument of the field it was given; coordinators edit it on the sites page.
    const sideDeg = Math.sqrt(fields.fieldOfViewDeg2);
    await tx.insert(instruments).values({ siteId: row.id, name: "Main camera", footprint: { shape: "rectangle", widthDeg: sideDeg, heightDeg: sideDeg }, filters: [], exposureS: 60, overheadS: 30, limitingMag: null, createdAt: now });
    await setObservers(tx, row.id, observerIds);
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId: row.id, code: fields.code, action: "created" } });
    return row.id;
  });
  return getSite(id);
}

export async function updateSite(actor: SessionUser, id: string, input: SiteInput, now: Date = new Date()): Promise<SiteRecord> {
  const db = await getDb();
  const { observerIds, ...fields } = input;
  await db.transaction(async (tx) => {
    const [existing] = await tx.select({ id: sites.id }).from(sites).where(eq(sites.id, id)).limit(1);
    if (!existing) throw new ApiError(404, "site not found");
    await checkCodeFree(tx, fields.code, id);
    await tx.update(sites).set(fields).where(eq(sites.id, id));
    await setObservers(tx, id, observerIds);
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId: id, code: fields.code, action: "updated" } });
  });
  return getSite(id);
}

/** Deletes a site; its tasks keep existing without a site (the foreign key sets null). */
export async function deleteSite(actor: SessionUser, id: string, now: Date = new Date()): Promise<void> {
  const db = await getDb();
  await db.transaction(async (tx) => {
    const [removed] = await tx.delete(sites).where(eq(sites.id, id)).returning({ code: sites.code });
    if (!removed) throw new ApiError(404, "site not found");
    await appendEvent(tx, { at: now, kind: eventKinds.siteChanged, actorId: actor.id, data: { siteId: id, code: removed.code, action: "deleted" } });
  });
}
