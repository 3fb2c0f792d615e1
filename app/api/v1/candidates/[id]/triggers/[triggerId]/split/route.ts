import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { splitTrigger } from "@/lib/services/regroup-triggers";
import { triggerParams } from "@/lib/validations/params";

/** Coordinators: splits one trigger out of this candidate (into its own, or back where a merge brought it from). */
export const POST = handler({ roles: can.regroupTriggers, params: triggerParams }, async ({ user, params }) =>
  splitTrigger({ actor: user, candidateId: params.id, triggerId: params.triggerId }),
);
