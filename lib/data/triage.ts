import { and, asc, desc, eq, gt, inArray, isNull, lte, sql } from "drizzle-orm";
import { getDb, type Tx } from "@/db";
import { alias } from "drizzle-orm/sqlite-core";
import { candidates, events, shifts, users, type AppEvent, type Candidate, type Role, type TriageState } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, hasRole, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { eventKinds } from "@/lib/events/kinds";
import { onCandidateAcknowledged } from "@/lib/notify/hooks";
import {
  acknowledges,
  allowedTransitions,
  canTransition,
  isDecision,
  requiresReason,
  triageLabels,
  type TriageVia,
} from "@/lib/triage/transitions";
import { appendEvent } from "./events";

export interface TransitionInput {
  actor: SessionUser;
  candidateId: string;
  to: TriageState;
  reason?: string;
  /** the version the caller saw; a different stored version is a 409 */
  expectedVersion?: number;
  via: TriageVia;
  /** injected clock for tests; defaults to now */
  now?: Date;
}

export interface TransitionResult {
  candidate: Candidate;
  event: AppEvent;
}

/** Who last changed the card, so a refused caller can see who beat them. */
export interface LastChange {
  by: { id: string; name: string } | null;
  at: string | null;
  kind: string | null;
}

/**
 * Moves a candidate to another triage column, checked against the allowed-transitions table and the actor's
 * role, in one write transaction with its audit event (and the acknowledgement hook when it leaves "new").
 * Throws ApiError 403 (role), 404 (no candidate), 409 (stale version or already there), 422 (not allowed, or a
 * dismissal without a reason).
 */
export async function transitionCandidate(input: TransitionInput): Promise<TransitionResult> {
  const { actor, candidateId, to, via } = input;
  requireRole(actor, can.triage, "triage");
  const reason = input.reason?.trim() || undefined;
  if (requiresReason(to) && !reason) {
    throw new ApiError(422, "dismissing needs a reason", { issues: [{ path: "reason", message: "required" }] });
  }
  const db = await getDb();
  return db.transaction(async (tx) => {
    const now = input.now ?? new Date();
    const current = await readCurrent(tx, candidateId, input.expectedVersion);
    if (current.triageState === to) {
      throw await staleError(tx, current, `the candidate is already in "${triageLabels[to]}"`);
    }
    if (!canTransition(current.triageState, to)) {
      throw new ApiError(422, `cannot move from "${triageLabels[current.triageState]}" to "${triageLabels[to]}"`, {
        from: current.triageState,
        to,
        allowed: allowedTransitions[current.triageState],
      });
    }
    if (to === "pursue" && current.stage === "withdrawn") {
      throw new ApiError(422, "the feed withdrew this candidate; it cannot go for follow-up");
    }
    const acknowledging = acknowledges(current.triageState, to);
    const updated = await writeVersioned(tx, current, now, {
      triageState: to,
      ...(acknowledging ? { acknowledgedAt: now, acknowledgedById: actor.id } : {}),
      ...(isDecision(to) ? { decidedAt: now } : {}),
      dismissReason: to === "dismissed" ? (reason ?? null) : null,
    });
    const event = await appendEvent(tx, {
      at: now,
      kind: eventKinds.candidateTriaged,
      actorId: actor.id,
      candidateId,
      fromState: current.triageState,
      toState: to,
      data: { via, version: updated.version, ...(reason ? { reason } : {}) },
    });
    if (acknowledging) await onCandidateAcknowledged(tx, { candidateId, userId: actor.id, at: now });
    return { candidate: updated, event };
  });
}

export interface AssignInput {
  actor: SessionUser;
  candidateId: string;
  /** null clears the owner */
  ownerId: string | null;
  expectedVersion?: number;
  via: TriageVia;
  now?: Date;
}

/** Gives a candidate an owner (a shifter or coordinator), with its audit event. Same errors as a transition. */
export async function assignCandidate(input: AssignInput): Promise<TransitionResult> {
  const { actor, candidateId, ownerId, via } = input;
  const db = await getDb();
  return db.transaction(async (tx) => {
    const now = input.now ?? new Date();
    const current = await readCurrent(tx, candidateId, input.expectedVersion);
    if (ownerId) {
      const [owner] = await tx.select().from(users).where(eq(users.id, ownerId)).limit(1);
      if (!owner || owner.disabledAt) throw new ApiError(404, "person not found");
      if (!hasRole(owner, can.triage)) {
        throw new ApiError(422, `${owner.name} is an ${owner.role} and cannot own a candidate`);
      }
    }
    if (current.ownerId === ownerId) throw await staleError(tx, current, "the candidate already has that owner");
    const updated = await writeVersioned(tx, current, now, { ownerId });
    const event = await appendEvent(tx, {
      at: now,
      kind: eventKinds.candidateAssigned,
      actorId: actor.id,
      candidateId,
      data: { ownerId, previousOwnerId: current.ownerId, via, version: updated.version },
    });
    return { candidate: updated, event };
  });
}

/** The candidate, or 404; a caller's expected version that differs from the stored one is a 409. */
async function readCurrent(tx: Tx, candidateId: string, expectedVersion: number | undefined): Promise<Candidate> {
  const current = await readCandidate(tx, candidateId);
  if (expectedVersion !== undefined && expectedVersion !== current.version) {
    throw await staleError(tx, current, "the candidate changed since you loaded it");
  }
  return current;
}

/** Applies a board change if nobody wrote since `current` was read (optimistic concurrency), bumping the version. */
async function writeVersioned(
  tx: Tx,
  current: Candidate,
  now: Date,
  changes: Partial<Pick<Candidate, "triageState" | "acknowledgedAt" | "acknowledgedById" | "decidedAt" | "dismissReason" | "ownerId">>,
): Promise<Candidate> {
  const [updated] = await tx
    .update(candidates)
    .set({ ...changes, updatedAt: now, version: sql`${candidates.version} + 1` })
    .where(and(eq(candidates.id, current.id), eq(candidates.version, current.version)))
    .returning();
  if (!updated) throw await staleError(tx, await readCandidate(tx, current.id), "the candidate changed meanwhile");
  return updated;
}

async function readCandidate(tx: Tx, candidateId: string): Promise<Candidate> {
  const [row] = await tx.select().from(candidates).where(eq(candidates.id, candidateId)).limit(1);
  if (!row) throw new ApiError(404, "candidate not found");
  return row;
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

async function staleError(tx: Tx, current: Candidate, message: string): Promise<ApiError> {
  const last = await lastBoardChange(tx, current.id);
  const who = last.by ? ` (last change by ${last.by.name})` : "";
  return new ApiError(409, `${message}${who}`, {
    current: { triageState: current.triageState, ownerId: current.ownerId, version: current.version },
    by: last.by,
    at: last.at,
  });
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
