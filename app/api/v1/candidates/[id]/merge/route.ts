import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { mergeCandidates } from "@/lib/services/regroup-triggers";
import { mergeBodySchema } from "@/lib/validations/candidates";
import { idParams } from "@/lib/validations/params";

/** Coordinators: merges the body's candidate into this one (all its triggers move here). Undone by a split. */
export const POST = handler({ roles: can.regroupTriggers, params: idParams, body: mergeBodySchema }, async ({ user, body, params }) =>
  mergeCandidates({ actor: user, fromCandidateId: body.candidateId, intoCandidateId: params.id }),
);
