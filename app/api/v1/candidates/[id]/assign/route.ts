import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { assignCandidate } from "@/lib/data/triage";
import { assignBodySchema } from "@/lib/validations/triage";

/** Gives a candidate an owner (`ownerId: null` clears it). */
export const POST = handler({ roles: can.triage, body: assignBodySchema }, async ({ user, body, params }) =>
  assignCandidate({
    actor: user,
    candidateId: params.id ?? "",
    ownerId: body.ownerId,
    expectedVersion: body.expectedVersion,
    via: body.via,
  }),
);
