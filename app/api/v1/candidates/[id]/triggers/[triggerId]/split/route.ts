import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { splitTrigger } from "@/lib/triggers/regroup";

/** Coordinators: splits one trigger out of this candidate (into its own, or back where a merge brought it from). */
export const POST = handler({ roles: can.regroupTriggers }, async ({ user, params }) =>
  splitTrigger({ actor: user, candidateId: params.id ?? "", triggerId: params.triggerId ?? "" }),
);
