import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { updateUser } from "@/lib/data/users";
import { updateUserSchema } from "@/lib/validations/users";
import { idParams } from "@/lib/validations/params";

export const PATCH = handler({ roles: can.manageUsers, params: idParams, body: updateUserSchema }, async ({ user, body, params }) => ({
  user: await updateUser(user, params.id, body),
}));
