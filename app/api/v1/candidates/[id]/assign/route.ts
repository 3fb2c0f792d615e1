import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { assignCandidate } from "@/lib/services/move-card";
import { assignBodySchema } from "@/lib/validations/triage";
import { idParams } from "@/lib/validations/params";

/** Gives a candidate an owner (`ownerId: null` clears it). */
export const POST = handler({ roles: can.triage, params: idParams, body: assignBodySchema }, async ({ user, body, params }) =>
  assignCandidate({
    actor: user,
    candidateId: params.id,
    ownerId: body.ownerId,
    expectedVersion: body.expectedVersion,
    via: body.via,
  }),
);
