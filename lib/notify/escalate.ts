import { and, asc, eq, lte } from "drizzle-orm";
import { getDb } from "@/db";
import { candidates, escalations } from "@/db/schema";
import { appendEvent } from "@/lib/data/events";
import { findShiftAt } from "@/lib/data/rota";
import { eventKinds } from "@/lib/events/kinds";
import type { EscalationTarget } from "@/lib/validations/paging";
import { candidateTextFor } from "./content";
import { candidatePath } from "./links";
import { queueNotifications } from "./outbox";
import { resolveTarget, targetRoleLabel } from "./recipients";

const due = (now: Date) => and(eq(escalations.status, "pending"), lte(escalations.dueAt, now));

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
  const [any] = await db.select({ id: escalations.id }).from(escalations).where(due(now)).limit(1);
  if (!any) return { fired: 0, cancelled: 0 };
  return db.transaction(async (tx) => {
      const rows = await tx.select().from(escalations).where(due(now)).orderBy(asc(escalations.dueAt)).limit(limit);
      const run: EscalationRun = { fired: 0, cancelled: 0 };
      for (const timer of rows) {
        const [c] = await tx.select().from(candidates).where(eq(candidates.id, timer.candidateId)).limit(1);
        if (!c || c.triageState !== "new" || c.withdrawnAt) {
          await tx.update(escalations).set({ status: "cancelled", lockedBy: workerId }).where(eq(escalations.id, timer.id));
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
        await tx.update(escalations).set({ status: "fired", firedAt: now, lockedBy: workerId }).where(eq(escalations.id, timer.id));
        run.fired += 1;
      }
      return run;
    });
}
