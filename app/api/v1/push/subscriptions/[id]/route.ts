import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { removeDevice } from "@/lib/notify/devices";

/** Forgets one of the person's devices (from the device list). */
export const DELETE = handler({ roles: can.read }, async ({ user, params }) => {
  await removeDevice(user.id, { id: params.id ?? "" });
  return { ok: true };
});
