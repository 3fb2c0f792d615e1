import { getDb } from "@/db";
import { ApiError } from "@/lib/api/errors";
import { can, hasRole } from "@/lib/auth/roles";
import { loadSessionUser } from "@/lib/auth/session";
import { spendAckToken, unspendAckToken } from "@/lib/data/outbox";
import { candidateWithAcknowledger } from "@/lib/data/paging-people";
import { transitionCandidate } from "@/lib/services/move-card";
import { ackLinkSecret, verifyAckToken } from "./ack-links";
import type { CandidateSummary } from "./content";

export type AckRefusal = "forged" | "expired" | "used" | "not-allowed";

export type AckLinkState =
  | { state: "refused"; reason: AckRefusal; message: string; httpStatus: number; usedAt?: string }
  | {
      state: "ready" | "already" | "done";
      candidate: CandidateSummary & { triageState: string };
      userName: string;
      timeZone: string;
      acknowledgedBy: string | null;
      acknowledgedAt: string | null;
      expiresAt: string;
    };

const refusals: Record<AckRefusal, { message: string; httpStatus: number }> = {
  forged: { message: "This acknowledge link is not valid. Open Chirpdesk and acknowledge from the board.", httpStatus: 403 },
  expired: { message: "This acknowledge link has expired. Open Chirpdesk and acknowledge from the board.", httpStatus: 410 },
  used: { message: "This acknowledge link was already used; each link works once.", httpStatus: 409 },
  "not-allowed": { message: "Your role may not acknowledge candidates.", httpStatus: 403 },
};

const refuse = (reason: AckRefusal, extra: { usedAt?: string } = {}): AckLinkState => ({ state: "refused", reason, ...refusals[reason], ...extra });

async function candidateState(candidateId: string) {
  return candidateWithAcknowledger(await getDb(), candidateId);
}

/**
 * What an acknowledge link would do, without using it (the GET page). Right after the button's POST
 * (`justUsed`) a spent link shows the outcome ("done"); any other visit to a spent link is refused as reused.
 */
export async function describeAckLink(token: string, now: Date, justUsed = false): Promise<AckLinkState> {
  const secret = ackLinkSecret();
  if (!secret) return refuse("forged");
  const db = await getDb();
  const check = await verifyAckToken(db, token, now, secret);
  if (!check.ok) return refuse(check.reason);
  const found = await candidateState(check.claims.candidateId);
  const person = await loadSessionUser(check.claims.userId);
  if (!found || !person) return refuse("forged");
  const { candidate, ackName } = found;
  if (check.usedAt && !justUsed) return refuse("used", { usedAt: check.usedAt.toISOString() });
  const state = check.usedAt ? "done" : candidate.triageState === "new" ? "ready" : "already";
  return {
    state,
    candidate,
    userName: person.name,
    timeZone: person.timeZone,
    acknowledgedBy: ackName ?? null,
    acknowledgedAt: candidate.acknowledgedAt?.toISOString() ?? null,
    expiresAt: new Date(check.claims.expiresAtMs).toISOString(),
  };
}

export type AckResult =
  | { ok: true; outcome: "acknowledged" | "already"; candidateId: string; acknowledgedBy: string | null; acknowledgedAt: string | null }
  | { ok: false; reason: AckRefusal; message: string; httpStatus: number };

/**
 * Uses a one-click link: checks signature and expiry, spends the single-use row, then acknowledges through the
 * triage domain (whose hook stops escalation in the same transaction). A link for a candidate someone already
 * acknowledged answers "already" and is spent too. A refusal (403) or an unexpected failure gives the link back.
 */
export async function acknowledgeWithLink(token: string, via: "email" | "push", now = new Date()): Promise<AckResult> {
  const secret = ackLinkSecret();
  const fail = (reason: AckRefusal): AckResult => ({ ok: false, reason, ...refusals[reason] });
  if (!secret) return fail("forged");
  const db = await getDb();
  const check = await verifyAckToken(db, token, now, secret);
  if (!check.ok) return fail(check.reason);
  if (check.usedAt) return fail("used");
  const actor = await loadSessionUser(check.claims.userId);
  if (!actor) return fail("forged");
  // A refused attempt (say the owner was demoted since the page) leaves the link unspent: spend it only on success.
  if (!hasRole(actor, can.triage)) return fail("not-allowed");
  if (!(await spendAckToken(db, check.claims.id, now))) return fail("used");
  const candidateId = check.claims.candidateId;
  try {
    const before = await candidateState(candidateId);
    if (before && before.candidate.triageState === "new") {
      await transitionCandidate({ actor, candidateId, to: "acknowledged", via, now });
      return { ok: true, outcome: "acknowledged", candidateId, acknowledgedBy: actor.name, acknowledgedAt: now.toISOString() };
    }
  } catch (error) {
    // 403: the role cannot triage; 409/422: someone moved it first — then it is "already", below.
    const giveBack = () => unspendAckToken(db, check.claims.id);
    if (error instanceof ApiError && error.status === 403) {
      await giveBack();
      return fail("not-allowed");
    }
    if (!(error instanceof ApiError && (error.status === 409 || error.status === 422))) {
      await giveBack();
      throw error;
    }
  }
  const after = await candidateState(candidateId);
  if (!after) return fail("forged");
  return {
    ok: true,
    outcome: "already",
    candidateId,
    acknowledgedBy: after.ackName ?? null,
    acknowledgedAt: after.candidate.acknowledgedAt?.toISOString() ?? null,
  };
}
