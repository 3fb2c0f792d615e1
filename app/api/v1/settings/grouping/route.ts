import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSetting, saveSetting } from "@/lib/data/settings";
import { groupingInputSchema } from "@/lib/validations/grouping";

/** GET /api/v1/settings/grouping — the coincidence window (ms) and the preferred-trigger rule. */
export const GET = handler({ roles: can.read }, async () => getSetting("grouping"));

/** PUT /api/v1/settings/grouping — coordinators and admins; applies to triggers that arrive from now on. */
export const PUT = handler({ roles: can.manageSettings, body: groupingInputSchema }, async ({ user, body }) =>
  saveSetting("grouping", body, user),
);
