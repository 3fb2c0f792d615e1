import type { SessionUser } from "@/lib/auth/roles";
import { getSetting, saveSetting } from "@/lib/data/settings";
import type { EscalationPolicy } from "@/lib/validations/paging";

export const readEscalationPolicy = (): Promise<EscalationPolicy> => getSetting("escalation");

/** Stores the policy with its audit event; it applies to candidates received from then on. */
export async function saveEscalationPolicy(actor: SessionUser, policy: EscalationPolicy, now = new Date()): Promise<EscalationPolicy> {
  return saveSetting("escalation", policy, actor, now);
}
