import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { skymapConeProbability } from "@/lib/data/skymaps";
import { coneQuerySchema } from "@/lib/validations/skymaps";
import { idParams } from "@/lib/validations/params";

/** Probability inside a cone (pixel centres inside, native resolution); 422 for out-of-range values. */
export const GET = handler({ roles: can.read, params: idParams, query: coneQuerySchema }, async ({ params, query }) => ({
  probability: await skymapConeProbability(params.id, query.raDeg, query.decDeg, query.radiusDeg),
}));
