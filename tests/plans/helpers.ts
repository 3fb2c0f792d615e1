import { count } from "drizzle-orm";
import { getDb } from "@/db";
import { instruments, planPointings, plans, siteObservers, sites, type Footprint } from "@/db/schema";

let counter = 0;

/** A fictional site with one instrument (inserted directly: these tests are about plans, not the sites API). */
export async function insertSiteWithInstrument(options: {
  latitudeDeg: number;
  longitudeDeg: number;
  timeZone?: string;
  minAltitudeDeg?: number;
  moonDistanceDeg?: number;
  footprint: Footprint;
  filters?: string[];
  observerIds?: string[];
}) {
  counter += 1;
  const db = await getDb();
  const [site] = await db
    .insert(sites)
    .values({
      code: `PL${counter}`,
      name: `Plan Test Ridge ${counter} (fictional)`,
      latitudeDeg: options.latitudeDeg,
      longitudeDeg: options.longitudeDeg,
      elevationM: 2000,
      minAltitudeDeg: options.minAltitudeDeg ?? 25,
      ...(options.moonDistanceDeg === undefined ? {} : { moonDistanceDeg: options.moonDistanceDeg }),
      fieldOfViewDeg2: 1,
      timeZone: options.timeZone ?? "UTC",
    })
    .returning();
  if (!site) throw new Error("site insert returned nothing");
  for (const userId of options.observerIds ?? []) await db.insert(siteObservers).values({ siteId: site.id, userId });
  const [instrument] = await db
    .insert(instruments)
    .values({ siteId: site.id, name: `Camera ${counter}`, footprint: options.footprint, filters: options.filters ?? ["g", "r"], exposureS: 300, overheadS: 60, limitingMag: null })
    .returning();
  if (!instrument) throw new Error("instrument insert returned nothing");
  return { site, instrument };
}

export async function planRowCounts() {
  const db = await getDb();
  const [p] = await db.select({ n: count() }).from(plans);
  const [q] = await db.select({ n: count() }).from(planPointings);
  return { plans: p?.n ?? 0, pointings: q?.n ?? 0 };
}

export interface PointingAnswer {
  id: string;
  index: number;
  raDeg: number;
  decDeg: number;
  probability: number;
  gainedProbability: number;
  cumulativeProbability: number;
  plannedStart: string | null;
  plannedEnd: string | null;
  altitudeDeg: number | null;
  airmass: number | null;
  moonSeparationDeg: number | null;
  unscheduledReason: string | null;
  doneAt: string | null;
}

export interface PlanAnswer {
  id: string;
  candidateId: string;
  instrumentId: string;
  skymapId: string;
  level: number;
  footprint: Footprint;
  window: { start: string; end: string };
  pointings: PointingAnswer[];
  totalProbability: number;
  scheduledProbability: number;
  avoid: string;
  avoidedProbability: number;
  maxPointings: number;
  filter: string | null;
  exposureS: number;
  taskId: string | null;
  site: { id: string; code: string; timeZone: string } | null;
}
