import type { GroupWrite } from "@/db/group-commit";
import { appendEvent } from "@/lib/data/events";
import type { IngestResult } from "./ingest-trigger";
import { insertDerivedStatement, insertRevisionStatement, insertTriggerStatement, type NewCandidateRow } from "@/lib/data/ingest-sql";
import { eventKinds } from "@/lib/events/kinds";
import { onTriggerJoined } from "@/lib/notify/hooks";
import { settleCandidate } from "@/lib/triggers/settle";

/**
 * A new trigger coincident with a live candidate (lib/data/triggers.ts findCoincidentCandidateId) joins it: the
 * trigger and its first revision are stored under that candidate, the preferred trigger is chosen again, the
 * timeline records the join, and paging decides by its re-page rule whether anyone hears of it again.
 */
export async function joinCandidate(tx: GroupWrite, row: NewCandidateRow, derivedJson: string): Promise<IngestResult> {
  const { payload } = row;
  const at = new Date(row.receivedAtMs);
  await tx.sql.execute(insertTriggerStatement(row));
  await tx.sql.execute(insertRevisionStatement(row));
  await tx.sql.execute(insertDerivedStatement(row));
  const settled = await settleCandidate(tx.orm, row.candidateId, at, "a trigger joined");
  const preferred = settled.preferred.id === row.triggerId;
  const event = await appendEvent(tx.orm, {
    at,
    kind: eventKinds.triggerJoined,
    candidateId: row.candidateId,
    data: {
      triggerId: row.triggerId,
      source: payload.source,
      externalId: payload.externalId,
      revision: payload.revision,
      stage: payload.stage,
      networkSnr: payload.networkSnr,
      falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
      triggerCount: settled.triggers.length,
      preferred,
    },
  });
  await onTriggerJoined(tx.orm, {
    candidateId: row.candidateId,
    eventId: event.id,
    receivedAt: at,
    triageState: settled.before.triageState,
    before: { stage: settled.before.stage, falseAlarmRatePerYear: settled.before.falseAlarmRatePerYear },
    after: { stage: settled.preferred.stage, falseAlarmRatePerYear: settled.preferred.falseAlarmRatePerYear },
  });
  return {
    status: 201,
    outcome: "joined",
    id: row.candidateId,
    triggerId: row.triggerId,
    preferred,
    revision: payload.revision,
    derivedJson,
  };
}
