import { getDb } from "@/db";
import type { SessionUser } from "@/lib/auth/roles";
import { appendEvent } from "@/lib/data/events";
import { getSetting, putSetting } from "@/lib/data/settings";
import { eventKinds } from "@/lib/events/kinds";
import type { EscalationPolicy } from "@/lib/validations/paging";

export const readEscalationPolicy = (): Promise<EscalationPolicy> => getSetting("escalation");

/** Stores the policy with its audit event; it applies to candidates received from then on. */
export async function saveEscalationPolicy(actor: SessionUser, policy: EscalationPolicy, now = new Date()): Promise<EscalationPolicy> {
  const db = await getDb();
  await db.transaction(async (tx) => {
      await putSetting("escalation", policy, actor.id, tx);
      await appendEvent(tx, { at: now, kind: eventKinds.settingsChanged, actorId: actor.id, data: { key: "escalation" } });
    });
  return readEscalationPolicy();
}
