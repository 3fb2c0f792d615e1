import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { getSetting, saveSetting } from "@/lib/data/settings";
import { deadlinesSchema } from "@/lib/validations/review";

/** GET /api/v1/settings/deadlines — every step deadline and the board's timers, in minutes. */
export const GET = handler({ roles: can.read }, async () => getSetting("deadlines"));

/**
 * PUT /api/v1/settings/deadlines — coordinators and admins replace every deadline (all fields required). Stored
 * events are untouched; the review re-evaluates with the new values on its next read.
 */
export const PUT = handler({ roles: can.manageSettings, body: deadlinesSchema }, async ({ user, body }) =>
  saveSetting("deadlines", body, user),
);
