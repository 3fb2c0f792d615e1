import { and, asc, eq, inArray, isNull, ne } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { siteObservers, sites, users, type NewSite, type Site } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";

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
  moonDistanceDeg: number;
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
    moonDistanceDeg: site.moonDistanceDeg,
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

/**
 * The least Moon distance (degrees) the site accepts, for the planner's schedule (lib/planning/schedule.ts
 * ScheduleSite.moonDistanceDeg); null for an unknown site. Pass the transaction when reading inside one.
 */
export async function siteMoonDistanceDeg(siteId: string, tx?: Tx): Promise<number | null> {
  const reader = tx ?? (await getDb());
  const [row] = await reader.select({ moonDistanceDeg: sites.moonDistanceDeg }).from(sites).where(eq(sites.id, siteId)).limit(1);
  return row?.moonDistanceDeg ?? null;
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

/** The site already using `code` (other than `exceptId`), if any. */
export async function findSiteIdByCode(tx: Tx, code: string, exceptId?: string): Promise<string | null> {
  const where = exceptId ? and(eq(sites.code, code), ne(sites.id, exceptId)) : eq(sites.code, code);
  const [taken] = await tx.select({ id: sites.id }).from(sites).where(where).limit(1);
  return taken?.id ?? null;
}

/** A site's stored row inside a transaction, for a service that compares before and after. */
export async function findSiteRow(tx: Tx, id: string): Promise<Site | null> {
  const [row] = await tx.select().from(sites).where(eq(sites.id, id)).limit(1);
  return row ?? null;
}

/** The ids among `ids` that belong to a person. */
export async function existingUserIds(tx: Tx, ids: string[]): Promise<string[]> {
  if (ids.length === 0) return [];
  return (await tx.select({ id: users.id }).from(users).where(inArray(users.id, ids))).map((r) => r.id);
}

export async function insertSite(tx: Tx, values: Omit<NewSite, "id">): Promise<string> {
  const [row] = await tx.insert(sites).values(values).returning({ id: sites.id });
  if (!row) throw new Error("site insert returned nothing");
  return row.id;
}

export async function updateSiteRow(tx: Tx, id: string, values: Partial<Omit<NewSite, "id" | "createdAt">>): Promise<void> {
  await tx.update(sites).set(values).where(eq(sites.id, id));
}

/** Deletes a site and answers its code, or null when there was none; tasks keep existing without a site (the foreign key sets null). */
export async function deleteSiteRow(tx: Tx, id: string): Promise<string | null> {
  const [removed] = await tx.delete(sites).where(eq(sites.id, id)).returning({ code: sites.code });
  return removed?.code ?? null;
}

/** Replaces the site's observer list. */
export async function replaceSiteObservers(tx: Tx, siteId: string, userIds: string[]): Promise<void> {
  await tx.delete(siteObservers).where(eq(siteObservers.siteId, siteId));
  if (userIds.length) await tx.insert(siteObservers).values(userIds.map((userId) => ({ siteId, userId })));
}
