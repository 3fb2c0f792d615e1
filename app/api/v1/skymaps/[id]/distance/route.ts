import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { skymapDistanceAt } from "@/lib/data/skymaps";
import { idParams } from "@/lib/validations/params";
import { positionQuerySchema } from "@/lib/validations/skymaps";

/** Distance (mean ± sd, Mpc) in the pixel holding a position; 409 for a map without distance columns. */
export const GET = handler({ roles: can.read, params: idParams, query: positionQuerySchema }, async ({ params, query }) => ({
  raDeg: query.raDeg,
  decDeg: query.decDeg,
  distance: await skymapDistanceAt(params.id, query.raDeg % 360, query.decDeg),
}));
