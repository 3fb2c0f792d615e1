import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { removeDevice } from "@/lib/notify/devices";
import { idParams } from "@/lib/validations/params";

/** Forgets one of the person's devices (from the device list). */
export const DELETE = handler({ roles: can.read, params: idParams }, async ({ user, params }) => {
  await removeDevice(user.id, { id: params.id });
  return { ok: true };
});
