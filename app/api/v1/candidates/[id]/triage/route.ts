import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { transitionCandidate } from "@/lib/services/move-card";
import { transitionBodySchema } from "@/lib/validations/triage";
import { idParams } from "@/lib/validations/params";

/** Moves a candidate to another triage column: 403 wrong role, 409 stale or beaten to it, 422 not allowed. */
export const POST = handler({ roles: can.triage, params: idParams, body: transitionBodySchema }, async ({ user, body, params }) =>
  transitionCandidate({
    actor: user,
    candidateId: params.id,
    to: body.to,
    reason: body.reason,
    expectedVersion: body.expectedVersion,
    via: body.via,
  }),
);
