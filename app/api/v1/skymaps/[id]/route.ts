import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSkymap } from "@/lib/data/skymaps";

export const GET = handler({ roles: can.read }, async ({ params }) => ({ skymap: await getSkymap(params.id ?? "") }));
