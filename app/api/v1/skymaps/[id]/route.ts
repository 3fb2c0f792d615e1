import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSkymap } from "@/lib/data/skymaps";
import { idParams } from "@/lib/validations/params";

export const GET = handler({ roles: can.read, params: idParams }, async ({ params }) => ({ skymap: await getSkymap(params.id) }));
