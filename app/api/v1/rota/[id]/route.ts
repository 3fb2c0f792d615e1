import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { deleteShift, updateShift } from "@/lib/data/rota";
import { shiftInputSchema } from "@/lib/validations/rota";

export const PUT = handler({ roles: can.manageRota, body: shiftInputSchema }, async ({ user, body, params }) =>
  updateShift(user, params.id ?? "", body),
);

export const DELETE = handler({ roles: can.manageRota }, async ({ user, params }) => {
  await deleteShift(user, params.id ?? "");
  return { ok: true };
});
