import { getDb } from "@/db";
import type { Instrument } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { findInstrument, insertInstrument, instrumentsOfSite, removeInstrument, siteCode, updateInstrument } from "@/lib/data/instruments";
import { eventKinds } from "@/lib/events/kinds";
import { footprintAreaDeg2, type InstrumentCreate, type InstrumentPatch } from "@/lib/validations/instruments";

/** An instrument as the API shows it: its stored fields plus the footprint's area on the sky. */
export interface InstrumentRecord extends Omit<Instrument, "createdAt"> {
  areaDeg2: number;
  createdAt: string;
}

function toRecord(row: Instrument): InstrumentRecord {
  return { ...row, areaDeg2: Math.round(footprintAreaDeg2(row.footprint) * 1e4) / 1e4, createdAt: row.createdAt.toISOString() };
}

const siteMissing = () => new ApiError(404, "site not found");
const instrumentMissing = () => new ApiError(404, "instrument not found");

export async function listInstruments(siteId: string): Promise<InstrumentRecord[]> {
  const db = await getDb();
  if ((await siteCode(db, siteId)) === null) throw siteMissing();
  return (await instrumentsOfSite(db, siteId)).map(toRecord);
}

export async function getInstrument(id: string): Promise<InstrumentRecord> {
  const db = await getDb();
  const row = await findInstrument(db, id);
  if (!row) throw instrumentMissing();
  return toRecord(row);
}

export async function createInstrument(actor: SessionUser, siteId: string, input: InstrumentCreate, now = new Date()): Promise<InstrumentRecord> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    if ((await siteCode(tx, siteId)) === null) throw siteMissing();
    const row = await insertInstrument(tx, siteId, input, now);
    await appendEvent(tx, { at: now, kind: eventKinds.instrumentChanged, actorId: actor.id, data: { instrumentId: row.id, siteId, name: row.name, action: "created" } });
    return toRecord(row);
  });
}

export async function patchInstrument(actor: SessionUser, id: string, patch: InstrumentPatch, now = new Date()): Promise<InstrumentRecord> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const existing = await findInstrument(tx, id);
    if (!existing) throw instrumentMissing();
    await updateInstrument(tx, id, patch);
    const row = await findInstrument(tx, id);
    if (!row) throw instrumentMissing();
    await appendEvent(tx, { at: now, kind: eventKinds.instrumentChanged, actorId: actor.id, data: { instrumentId: id, siteId: row.siteId, name: row.name, action: "updated" } });
    return toRecord(row);
  });
}

export async function deleteInstrument(actor: SessionUser, id: string, now = new Date()): Promise<void> {
  const db = await getDb();
  await db.transaction(async (tx) => {
    const existing = await findInstrument(tx, id);
    if (!existing) throw instrumentMissing();
    await removeInstrument(tx, id);
    await appendEvent(tx, { at: now, kind: eventKinds.instrumentChanged, actorId: actor.id, data: { instrumentId: id, siteId: existing.siteId, name: existing.name, action: "deleted" } });
  });
}
