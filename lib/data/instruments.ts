import { asc, eq } from "drizzle-orm";
import type { Tx } from "@/db";
import { instruments, sites, type Instrument } from "@/db/schema";

/** Storage of instruments: queries only; the service decides what a missing row means. */
export type InstrumentValues = Omit<Instrument, "id" | "siteId" | "createdAt">;

export async function siteCode(tx: Tx, siteId: string): Promise<string | null> {
  const [row] = await tx.select({ code: sites.code }).from(sites).where(eq(sites.id, siteId)).limit(1);
  return row?.code ?? null;
}

export async function instrumentsOfSite(tx: Tx, siteId: string): Promise<Instrument[]> {
  return tx.select().from(instruments).where(eq(instruments.siteId, siteId)).orderBy(asc(instruments.name), asc(instruments.id));
}

export async function findInstrument(tx: Tx, id: string): Promise<Instrument | null> {
  const [row] = await tx.select().from(instruments).where(eq(instruments.id, id)).limit(1);
  return row ?? null;
}

export async function insertInstrument(tx: Tx, siteId: string, values: InstrumentValues, now: Date): Promise<Instrument> {
  const [row] = await tx.insert(instruments).values({ ...values, siteId, createdAt: now }).returning();
  if (!row) throw new Error("instrument insert returned nothing");
  return row;
}

export async function updateInstrument(tx: Tx, id: string, values: Partial<InstrumentValues>): Promise<void> {
  await tx.update(instruments).set(values).where(eq(instruments.id, id));
}

export async function removeInstrument(tx: Tx, id: string): Promise<void> {
  await tx.delete(instruments).where(eq(instruments.id, id));
}
