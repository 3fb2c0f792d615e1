import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { listDevices, subscribeDevice } from "@/lib/notify/devices";
import { pushSubscribeSchema } from "@/lib/validations/paging";

/** The person's push devices. */
export const GET = handler({ roles: can.read }, async ({ user }) => ({ items: await listDevices(user.id) }));

/** Subscribes this browser: the body is `PushSubscription.toJSON()` plus a label. */
export const POST = handler({ roles: can.read, body: pushSubscribeSchema }, async ({ user, body }) => subscribeDevice(user.id, body));
