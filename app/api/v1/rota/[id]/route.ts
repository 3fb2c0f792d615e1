import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { deleteShift, updateShift } from "@/lib/data/rota";
import { shiftInputSchema } from "@/lib/validations/rota";
import { idParams } from "@/lib/validations/params";

export const PUT = handler({ roles: can.manageRota, params: idParams, body: shiftInputSchema }, async ({ user, body, params }) =>
  updateShift(user, params.id, body),
);

export const DELETE = handler({ roles: can.manageRota, params: idParams }, async ({ user, params }) => {
  await deleteShift(user, params.id);
  return { ok: true };
});
