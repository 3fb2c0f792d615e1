import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { tickPointing } from "@/lib/services/tick-pointing";
import { planPointingParams, pointingTickSchema } from "@/lib/validations/plans";

/** Ticks a planned pointing done ({ "done": true }) or takes the tick back ({ "done": false }). */
export const PATCH = handler({ roles: can.tickPointings, params: planPointingParams, body: pointingTickSchema }, async ({ user, params, body, now }) => ({
  pointing: await tickPointing(user, params.id, params.pointingId, body, now),
}));
