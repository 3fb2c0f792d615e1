import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { removeDevice } from "@/lib/notify/devices";
import { pushUnsubscribeSchema } from "@/lib/validations/paging";

/** Unsubscribes this browser by its endpoint (after PushSubscription.unsubscribe()). */
export const POST = handler({ roles: can.read, body: pushUnsubscribeSchema }, async ({ user, body }) => {
  await removeDevice(user.id, { endpoint: body.endpoint });
  return { ok: true };
});
