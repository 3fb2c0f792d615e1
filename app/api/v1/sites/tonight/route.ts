import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { tonightOverview } from "@/lib/data/visibility";
import { tonightQuerySchema } from "@/lib/validations/sites";

/** Each site's coming night and what it can observe of recent candidates' sky maps. */
export const GET = handler({ roles: can.read, query: tonightQuerySchema }, async ({ query }) => tonightOverview(new Date(), query));
