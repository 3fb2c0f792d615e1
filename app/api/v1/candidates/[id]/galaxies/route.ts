import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { rankCandidateGalaxies } from "@/lib/services/rank-galaxies";
import { galaxyRankQuerySchema } from "@/lib/validations/catalogues";
import { idParams } from "@/lib/validations/params";

/** Galaxies of a catalogue ranked as hosts in the candidate's newest 3D sky map; 409 for a map without distances. */
export const GET = handler({ roles: can.read, params: idParams, query: galaxyRankQuerySchema }, async ({ params, query, now }) =>
  rankCandidateGalaxies(params.id, query, now),
);
