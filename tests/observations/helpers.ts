import { readFileSync } from "node:fs";
import { count } from "drizzle-orm";
import { getDb } from "@/db";
import { counterparts, events, followUpTasks, instruments, observations, siteObservers, sites, type Footprint } from "@/db/schema";
import { eventKinds } from "@/lib/events/kinds";

/** Healpy unions and searched regions (tests/fixtures/scripts/coverage_make_fixtures.py, python3-healpy on Debian). */
export interface CoverageReference {
  logs: Array<Array<{ footprint: Footprint; raDeg: number; decDeg: number }>>;
  positions: Array<{ raDeg: number; decDeg: number }>;
  maps: Record<
    string,
    {
      file: string;
      unions: Array<{ pixelCount: number; coveredProbability: number; coveredAreaDeg2: number }>;
      searched: Array<{ searchedProbability: number; searchedAreaDeg2: number; probabilityDensityPerDeg2: number }>;
    }
  >;
}
export const coverageReference = JSON.parse(readFileSync(new URL("../fixtures/coverage/reference.json", import.meta.url), "utf8")) as CoverageReference;

let siteCounter = 0;

/** A fictional site with the given instruments (footprints), and the people who observe there. */
export async function insertSite(footprints: Footprint[], observerIds: string[] = []) {
  siteCounter += 1;
  const db = await getDb();
  const [site] = await db
    .insert(sites)
    .values({ code: `OB${siteCounter}`, name: `Observation Test Ridge ${siteCounter} (fictional)`, latitudeDeg: -30, longitudeDeg: 20, elevationM: 1800, fieldOfViewDeg2: 4 })
    .returning();
  if (!site) throw new Error("site insert returned nothing");
  const made = [];
  for (const [k, footprint] of footprints.entries()) {
    const [row] = await db
      .insert(instruments)
      .values({ siteId: site.id, name: `Camera ${k + 1}`, footprint, filters: ["g", "r"], exposureS: 60, overheadS: 15, limitingMag: 21 })
      .returning();
    if (row) made.push(row);
  }
  for (const userId of observerIds) await db.insert(siteObservers).values({ siteId: site.id, userId });
  return { id: site.id, instruments: made };
}

export async function insertTask(candidateId: string, options: { siteId?: string | null; claimedById?: string | null; at?: Date } = {}) {
  const db = await getDb();
  const at = options.at ?? new Date(Date.UTC(2030, 2, 20));
  const claimed = Boolean(options.claimedById);
  const [task] = await db
    .insert(followUpTasks)
    .values({
      candidateId,
      kind: "wide-field-tiling",
      siteId: options.siteId ?? null,
      state: claimed ? "claimed" : "open",
      claimedById: options.claimedById ?? null,
      claimedAt: claimed ? at : null,
      createdAt: at,
      updatedAt: at,
    })
    .returning();
  if (!task) throw new Error("task insert returned nothing");
  return task.id;
}

/** Rows that prove "nothing stored": observations, counterparts and their audit events. */
export async function observationCounts() {
  const db = await getDb();
  const [o] = await db.select({ n: count() }).from(observations);
  const [c] = await db.select({ n: count() }).from(counterparts);
  const all = await db.select({ kind: events.kind }).from(events);
  const kinds = new Set<string>([eventKinds.observationsRecorded, eventKinds.counterpartReported]);
  return { observations: o?.n ?? 0, counterparts: c?.n ?? 0, events: all.filter((e) => kinds.has(e.kind)).length };
}
