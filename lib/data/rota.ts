import { and, asc, desc, eq, gt, inArray, isNull, lt, lte } from "drizzle-orm";
import { alias } from "drizzle-orm/sqlite-core";
import { getDb, type Tx } from "@/db";
import { shifts, users, type Shift } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, hasRole, type SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import type { ShiftInput } from "@/lib/validations/rota";
import { appendEvent } from "./events";

export interface RotaPerson {
  id: string;
  name: string;
  initials: string;
  role: string;
  timeZone: string;
}

export interface ShiftView {
  id: string;
  startsAt: string;
  endsAt: string;
  primary: RotaPerson;
  backup: RotaPerson | null;
  notes: string;
}

const primaryUser = alias(users, "primary_user");
const backupUser = alias(users, "backup_user");

const person = (u: { id: string; name: string; initials: string; role: string; timeZone: string }): RotaPerson => ({
  id: u.id,
  name: u.name,
  initials: u.initials,
  role: u.role,
  timeZone: u.timeZone,
});

/** Shifts overlapping [from, to), earliest first, with the people on them. */
export async function listShifts(from: Date, to: Date): Promise<ShiftView[]> {
  const db = await getDb();
  const rows = await db
    .select({ shift: shifts, primary: primaryUser, backup: backupUser })
    .from(shifts)
    .innerJoin(primaryUser, eq(primaryUser.id, shifts.primaryId))
    .leftJoin(backupUser, eq(backupUser.id, shifts.backupId))
    .where(and(lt(shifts.startsAt, to), gt(shifts.endsAt, from)))
    .orderBy(asc(shifts.startsAt), asc(shifts.endsAt));
  return rows.map(({ shift, primary, backup }) => ({
    id: shift.id,
    startsAt: shift.startsAt.toISOString(),
    endsAt: shift.endsAt.toISOString(),
    primary: person(primary),
    backup: backup ? person(backup) : null,
    notes: shift.notes,
  }));
}

/** The shift covering `at`; when shifts overlap, the one that began last (the latest handover) wins. */
export async function findShiftAt(q: Tx, at: Date): Promise<Shift | null> {
  const [row] = await q
    .select()
    .from(shifts)
    .where(and(lte(shifts.startsAt, at), gt(shifts.endsAt, at)))
    .orderBy(desc(shifts.startsAt))
    .limit(1);
  return row ?? null;
}

/** Whether the person is the on-call primary at `at`, and until when. */
export async function onCallPrimaryUntil(q: Tx, userId: string, at: Date): Promise<Date | null> {
  const shift = await findShiftAt(q, at);
  return shift && shift.primaryId === userId ? shift.endsAt : null;
}

/** People who may be on call: shifters and coordinators with an active account. */
export async function listRotaPeople(): Promise<RotaPerson[]> {
  const db = await getDb();
  const rows = await db
    .select()
    .from(users)
    .where(and(inArray(users.role, [...can.triage]), isNull(users.disabledAt)))
    .orderBy(asc(users.name));
  return rows.map(person);
}

async function checkPeople(tx: Tx, input: ShiftInput): Promise<void> {
  const ids = [input.primaryId, ...(input.backupId ? [input.backupId] : [])];
  const found = await tx.select().from(users).where(inArray(users.id, ids));
  for (const [field, id] of [["primaryId", input.primaryId], ["backupId", input.backupId]] as const) {
    if (!id) continue;
    const row = found.find((u) => u.id === id);
    if (!row || row.disabledAt) throw new ApiError(422, `${field}: no such active person`, { issues: [{ path: field, message: "unknown person" }] });
    if (!hasRole(row, can.triage)) {
      throw new ApiError(422, `${field}: ${row.name} is an ${row.role} and cannot be on call`, {
        issues: [{ path: field, message: "must be a shifter or coordinator" }],
      });
    }
  }
}

export async function createShift(actor: SessionUser, input: ShiftInput, now = new Date()): Promise<Shift> {
  const db = await getDb();
  return db.transaction(async (tx) => {
      await checkPeople(tx, input);
      const [row] = await tx.insert(shifts).values({ ...input, createdAt: now }).returning();
      if (!row) throw new Error("shift insert returned nothing");
      await appendEvent(tx, { at: now, kind: eventKinds.shiftChanged, actorId: actor.id, data: { shiftId: row.id, action: "created" } });
      return row;
    });
}

export async function updateShift(actor: SessionUser, id: string, input: ShiftInput, now = new Date()): Promise<Shift> {
  const db = await getDb();
  return db.transaction(async (tx) => {
      await checkPeople(tx, input);
      // A changed end re-arms the end-of-shift handoff.
      const [row] = await tx.update(shifts).set({ ...input, handoffQueuedAt: null }).where(eq(shifts.id, id)).returning();
      if (!row) throw new ApiError(404, "shift not found");
      await appendEvent(tx, { at: now, kind: eventKinds.shiftChanged, actorId: actor.id, data: { shiftId: id, action: "updated" } });
      return row;
    });
}

export async function deleteShift(actor: SessionUser, id: string, now = new Date()): Promise<void> {
  const db = await getDb();
  await db.transaction(async (tx) => {
      const [row] = await tx.delete(shifts).where(eq(shifts.id, id)).returning({ id: shifts.id });
      if (!row) throw new ApiError(404, "shift not found");
      await appendEvent(tx, { at: now, kind: eventKinds.shiftChanged, actorId: actor.id, data: { shiftId: id, action: "deleted" } });
    });
}
