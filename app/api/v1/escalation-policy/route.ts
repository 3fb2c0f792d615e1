import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { readEscalationPolicy, saveEscalationPolicy } from "@/lib/notify/policy-store";
import { escalationPolicySchema } from "@/lib/validations/paging";

/** The escalation policy every new candidate is paged by (coordinators change it). */
export const GET = handler({ roles: can.read }, async () => readEscalationPolicy());

export const PUT = handler({ roles: can.manageSettings, body: escalationPolicySchema }, async ({ user, body }) => saveEscalationPolicy(user, body));
