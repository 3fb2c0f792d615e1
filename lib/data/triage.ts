import { and, asc, desc, eq, gt, inArray, isNull, lte, sql } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { alias } from "drizzle-orm/sqlite-core";
import { candidates, events, shifts, users, type Candidate, type Role, type User } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";

/** Who last changed the card, so a refused caller can see who beat them. */
export interface LastChange {
  by: { id: string; name: string } | null;
  at: string | null;
  kind: string | null;
}

/** Applies a board change if nobody wrote since `current` was read (optimistic concurrency), bumping the version; null when someone did. */
export async function writeBoardChange(
  tx: Tx,
  current: Candidate,
  now: Date,
  changes: Partial<Pick<Candidate, "triageState" | "acknowledgedAt" | "acknowledgedById" | "decidedAt" | "dismissReason" | "ownerId">>,
): Promise<Candidate | null> {
  const [updated] = await tx
    .update(candidates)
    .set({ ...changes, updatedAt: now, version: sql`${candidates.version} + 1` })
    .where(and(eq(candidates.id, current.id), eq(candidates.version, current.version)))
    .returning();
  return updated ?? null;
}

/** The candidate, or 404. */
export async function readBoardCandidate(tx: Tx, candidateId: string): Promise<Candidate> {
  const [row] = await tx.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!row) throw new ApiError(404, "candidate not found");
  return row;
}

/** A person by id, or null. */
export async function readPerson(tx: Tx, userId: string): Promise<User | null> {
  const [row] = await tx.select().from(users).where(eq(users.id, userId)).limit(1);
  return row ?? null;
}

/** The last board change (triage or assignment) on a candidate, with the person who made it. */
export async function lastBoardChange(tx: Tx, candidateId: string): Promise<LastChange> {
  const [row] = await tx
    .select({ kind: events.kind, at: events.at, actorId: events.actorId, actorName: users.name })
    .from(events)
    .leftJoin(users, eq(users.id, events.actorId))
    .where(
      and(
        eq(events.candidateId, candidateId),
        inArray(events.kind, [eventKinds.candidateTriaged, eventKinds.candidateAssigned]),
      ),
    )
    .orderBy(desc(events.id))
    .limit(1);
  if (!row) return { by: null, at: null, kind: null };
  return {
    by: row.actorId ? { id: row.actorId, name: row.actorName ?? "someone" } : null,
    at: row.at.toISOString(),
    kind: row.kind,
  };
}

export interface RosterPerson {
  id: string;
  name: string;
  initials: string;
  role: Role;
}

export interface Roster {
  /** shifts covering now: who is paged first, and their backup */
  onCall: Array<{ shiftId: string; startsAt: number; endsAt: number; primary: RosterPerson; backup: RosterPerson | null }>;
  /** everyone who may own a candidate (shifters and coordinators), on call first */
  people: RosterPerson[];
}

/** The people beside the board: who is on call now (shifts table) and who else can take a candidate. */
export async function getRoster(now: Date = new Date()): Promise<Roster> {
  const db = await getDb();
  const backup = alias(users, "backup");
  const person = { id: users.id, name: users.name, initials: users.initials, role: users.role };
  const [shiftRows, peopleRows] = await Promise.all([
    db
      .select({
        shift: shifts,
        primary: person,
        backup: { id: backup.id, name: backup.name, initials: backup.initials, role: backup.role },
      })
      .from(shifts)
      .innerJoin(users, eq(users.id, shifts.primaryId))
      .leftJoin(backup, eq(backup.id, shifts.backupId))
      .where(and(lte(shifts.startsAt, now), gt(shifts.endsAt, now)))
      .orderBy(asc(shifts.startsAt)),
    db
      .select(person)
      .from(users)
      .where(and(inArray(users.role, [...can.triage]), isNull(users.disabledAt)))
      .orderBy(asc(users.name)),
  ]);
  const onCall = shiftRows.map((row) => ({
    shiftId: row.shift.id,
    startsAt: row.shift.startsAt.getTime(),
    endsAt: row.shift.endsAt.getTime(),
    primary: row.primary,
    backup: row.backup?.id ? row.backup : null,
  }));
  const onCallIds = new Set(onCall.flatMap((s) => [s.primary.id, s.backup?.id]));
  const people = [...peopleRows].sort((a, b) => Number(onCallIds.has(b.id)) - Number(onCallIds.has(a.id)));
  return { onCall, people };
}
