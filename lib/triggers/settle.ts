import type { Candidate, Trigger } from "@/db/schema";
import type { Tx } from "@/db";
import { appendEvent } from "@/lib/data/events";
import { getSetting } from "@/lib/data/settings";
import { listTriggersOf, readCandidateRow, writeCandidateFromTriggers } from "@/lib/data/triggers";
import { eventKinds } from "@/lib/events/kinds";
import { choosePreferred, type RankedTrigger } from "./preferred";

export interface Settled {
  before: Candidate;
  preferred: Trigger;
  triggers: Trigger[];
  preferredChanged: boolean;
  /** every trigger is now withdrawn and the candidate was not */
  becameWithdrawn: boolean;
}

function ranked(t: Trigger): Trigger & RankedTrigger {
  return Object.assign(t, { receivedAtMs: t.receivedAt.getTime(), withdrawn: t.withdrawnAt !== null });
}

/**
 * After any of a candidate's triggers changed (a revision, a join, a split, a merge): choose the preferred trigger
 * again, copy its latest revision into the candidate's headline, count the triggers, take the first receipt, and
 * withdraw the candidate exactly when every trigger is withdrawn. Records a change of preferred trigger in the
 * timeline. Inside the caller's transaction.
 */
export async function settleCandidate(tx: Tx, candidateId: string, at: Date, reason: string): Promise<Settled> {
  const before = await readCandidateRow(tx, candidateId);
  if (!before) throw new Error(`candidate ${candidateId} disappeared inside the write transaction`);
  const all = (await listTriggersOf(tx, candidateId)).map(ranked);
  const { preferredBy } = await getSetting("grouping", tx);
  const preferred = choosePreferred(all, preferredBy);
  if (!preferred) throw new Error(`candidate ${candidateId} has no triggers`);
  const allWithdrawn = all.every((t) => t.withdrawn);
  const receivedAt = new Date(Math.min(...all.map((t) => t.receivedAtMs)));
  const withdrawnAt = allWithdrawn ? (before.withdrawnAt ?? at) : null;
  await writeCandidateFromTriggers(tx, candidateId, { preferred, triggerCount: all.length, receivedAt, withdrawnAt }, at);
  const preferredChanged = before.preferredTriggerId !== preferred.id;
  if (preferredChanged && before.preferredTriggerId !== null) {
    await appendEvent(tx, {
      at,
      kind: eventKinds.preferredChanged,
      candidateId,
      data: {
        fromTriggerId: before.preferredTriggerId,
        toTriggerId: preferred.id,
        source: preferred.source,
        externalId: preferred.externalId,
        falseAlarmRatePerYear: preferred.falseAlarmRatePerYear,
        networkSnr: preferred.networkSnr,
        rule: preferredBy,
        reason,
      },
    });
  }
  return { before, preferred, triggers: all, preferredChanged, becameWithdrawn: allWithdrawn && before.withdrawnAt === null };
}
