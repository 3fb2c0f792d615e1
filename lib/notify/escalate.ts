import { getDb } from "@/db";
import { anyEscalationDue, closeEscalation, listDueEscalations } from "@/lib/data/escalations";
import { appendEvent } from "@/lib/data/events";
import { readCandidateRow } from "@/lib/data/paging-people";
import { findShiftAt } from "@/lib/data/rota";
import { eventKinds } from "@/lib/events/kinds";
import type { EscalationTarget } from "@/lib/validations/paging";
import { candidateTextFor } from "./content";
import { candidatePath } from "./links";
import { queueNotifications } from "./outbox";
import { resolveTarget, targetRoleLabel } from "./recipients";

export interface EscalationRun {
  fired: number;
  cancelled: number;
}

/**
 * Fires due escalation timers. Choosing, checking and firing happen in one write transaction (no outside call
 * is made here, so no lease is needed): a timer fires once, and never for a candidate that left "new" (acknowledged,
 * decided) or was withdrawn — an acknowledgement commits either before (timer cancelled) or after (its pages
 * not yet sent are cancelled).
 */
export async function fireDueEscalations(workerId: string, now: Date, limit = 50): Promise<EscalationRun> {
  const db = await getDb();
  if (!(await anyEscalationDue(now))) return { fired: 0, cancelled: 0 };
  return db.transaction(async (tx) => {
      const rows = await listDueEscalations(tx, now, limit);
      const run: EscalationRun = { fired: 0, cancelled: 0 };
      for (const timer of rows) {
        const c = await readCandidateRow(tx, timer.candidateId);
        if (!c || c.triageState !== "new" || c.withdrawnAt) {
          await closeEscalation(tx, timer.id, workerId, { status: "cancelled" });
          run.cancelled += 1;
          continue;
        }
        const target = timer.target as EscalationTarget;
        const recipients = await resolveTarget(tx, target, await findShiftAt(tx, c.receivedAt));
        const userIds = recipients.map((r) => r.id);
        const event = await appendEvent(tx, {
          at: now,
          kind: eventKinds.escalationFired,
          candidateId: c.id,
          data: { step: timer.step, target, userIds, escalationId: timer.id },
        });
        if (userIds.length > 0) {
          const minutes = (now.getTime() - c.receivedAt.getTime()) / 60_000;
          const text = candidateTextFor(c, { kind: "escalation", role: targetRoleLabel[target], minutesUnacknowledged: minutes });
          await queueNotifications(
            tx,
            { eventId: event.id, kind: "escalation", ...text, path: candidatePath(c.id), candidateId: c.id, channels: ["push", "email"], ackable: true, now },
            userIds,
          );
          await appendEvent(tx, {
            at: now,
            kind: eventKinds.pageQueued,
            candidateId: c.id,
            data: { userIds, channels: ["push", "email", "in-app"], reason: "escalation", step: timer.step, target },
          });
        }
        await closeEscalation(tx, timer.id, workerId, { status: "fired", firedAt: now });
        run.fired += 1;
      }
      return run;
    });
}
