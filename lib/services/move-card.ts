import { getDb, type Tx } from "@/db";
import type { AppEvent, Candidate, TriageState } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { can, hasRole, type SessionUser } from "@/lib/auth/roles";
import { requireRole } from "@/lib/auth/require-role";
import { appendEvent } from "@/lib/data/events";
import { lastBoardChange, readBoardCandidate, readPerson, writeBoardChange } from "@/lib/data/triage";
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
      const owner = await readPerson(tx, ownerId);
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
  const current = await readBoardCandidate(tx, candidateId);
  if (expectedVersion !== undefined && expectedVersion !== current.version) {
    throw await staleError(tx, current, "the candidate changed since you loaded it");
  }
  return current;
}

/** Writes a board change, or the 409 naming who changed the card meanwhile. */
async function writeVersioned(tx: Tx, current: Candidate, now: Date, changes: Parameters<typeof writeBoardChange>[3]): Promise<Candidate> {
  const updated = await writeBoardChange(tx, current, now, changes);
  if (!updated) throw await staleError(tx, await readBoardCandidate(tx, current.id), "the candidate changed meanwhile");
  return updated;
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

