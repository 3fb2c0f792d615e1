/**
 * A coordinator's corrections to grouping: split a trigger out of its candidate, merge one candidate into another.
 * Each is audited on both candidates and undone by the other: merging a split-out candidate back returns its
 * trigger; splitting a trigger that arrived by a merge returns it, with every trigger of that merge, to the
 * candidate it came from (which keeps its triage, tasks and notes while merged).
 */
import { getDb } from "@/db";
import { ApiError, notFound } from "@/lib/api/errors";
import type { SessionUser } from "@/lib/auth/roles";
import type { Tx } from "@/db";
import { appendEvent } from "@/lib/data/events";
import {
  findMergeOrigin,
  insertCandidateForTrigger,
  listTriggersOf,
  markMerged,
  moveTrigger,
  readCandidateRow,
} from "@/lib/data/triggers";
import { eventKinds } from "@/lib/events/kinds";
import { onCandidateMerged } from "@/lib/notify/hooks";
import { settleCandidate } from "@/lib/triggers/settle";

export interface RegroupResult {
  fromCandidateId: string;
  toCandidateId: string;
  triggerIds: string[];
  /** a split that returned the triggers to the candidate a merge had brought them from */
  returnedToMergedCandidate: boolean;
}

async function liveCandidate(tx: Tx, id: string) {
  const row = await readCandidateRow(tx, id);
  if (!row) throw notFound("candidate");
  if (row.mergedIntoId) throw new ApiError(409, `candidate ${row.externalId} was merged into another candidate`, { mergedIntoId: row.mergedIntoId });
  return row;
}

/** Splits a trigger out of its candidate: back to the candidate a merge brought it from, else into a new one. */
export async function splitTrigger(input: { actor: SessionUser; candidateId: string; triggerId: string; now?: Date }): Promise<RegroupResult> {
  const now = input.now ?? new Date();
  const db = await getDb();
  return db.transaction(async (tx) => {
    const from = await liveCandidate(tx, input.candidateId);
    const all = await listTriggersOf(tx, from.id);
    const trigger = all.find((t) => t.id === input.triggerId);
    if (!trigger) throw notFound("trigger of this candidate");
    if (all.length < 2) throw new ApiError(409, "a candidate's only trigger cannot be split out of it");
    const origin = await findMergeOrigin(tx, from.id, trigger.id);
    let moving = origin ? all.filter((t) => origin.triggerIds.includes(t.id)) : [trigger];
    // Never empty the candidate: if every trigger came by that merge, only this one leaves.
    if (moving.length === all.length) moving = [trigger];
    const toId = origin ? origin.fromCandidateId : await insertCandidateForTrigger(tx, trigger, now);
    for (const t of moving) await moveTrigger(tx, t.id, toId);
    if (origin) await markMerged(tx, toId, null, now);
    await settleCandidate(tx, from.id, now, "a trigger was split out");
    await settleCandidate(tx, toId, now, "split out of another candidate");
    const triggerIds = moving.map((t) => t.id);
    const data = { triggerIds, fromCandidateId: from.id, toCandidateId: toId, returnedToMergedCandidate: origin !== null };
    for (const candidateId of [from.id, toId]) {
      await appendEvent(tx, { at: now, kind: eventKinds.triggerSplit, actorId: input.actor.id, candidateId, data });
    }
    return { fromCandidateId: from.id, toCandidateId: toId, triggerIds, returnedToMergedCandidate: origin !== null };
  });
}

/** Merges `fromCandidateId` into `intoCandidateId`: all its triggers move; it leaves the lists, pointing at the other. */
export async function mergeCandidates(input: {
  actor: SessionUser;
  fromCandidateId: string;
  intoCandidateId: string;
  now?: Date;
}): Promise<RegroupResult> {
  if (input.fromCandidateId === input.intoCandidateId) {
    throw new ApiError(422, "a candidate cannot be merged into itself", { issues: [{ path: "candidateId", message: "is this candidate" }] });
  }
  const now = input.now ?? new Date();
  const db = await getDb();
  return db.transaction(async (tx) => {
    const into = await liveCandidate(tx, input.intoCandidateId);
    const from = await liveCandidate(tx, input.fromCandidateId);
    const moving = await listTriggersOf(tx, from.id);
    for (const t of moving) await moveTrigger(tx, t.id, into.id);
    await markMerged(tx, from.id, into.id, now);
    await settleCandidate(tx, into.id, now, "candidates merged");
    const triggerIds = moving.map((t) => t.id);
    const data = { triggerIds, fromCandidateId: from.id, intoCandidateId: into.id };
    for (const candidateId of [from.id, into.id]) {
      await appendEvent(tx, { at: now, kind: eventKinds.candidatesMerged, actorId: input.actor.id, candidateId, data });
    }
    await onCandidateMerged(tx, { fromCandidateId: from.id, at: now });
    return { fromCandidateId: from.id, toCandidateId: into.id, triggerIds, returnedToMergedCandidate: false };
  });
}
