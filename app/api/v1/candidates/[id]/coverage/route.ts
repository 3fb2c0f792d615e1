import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { readCandidateCoverage } from "@/lib/services/read-coverage";
import { idParams } from "@/lib/validations/params";

/** Covered probability of the newest sky map by every logged footprint, its curve and per-site unions. */
export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => readCandidateCoverage(params.id));
