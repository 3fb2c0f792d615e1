import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { updateUser } from "@/lib/data/users";
import { updateUserSchema } from "@/lib/validations/users";

export const PATCH = handler({ roles: can.manageUsers, body: updateUserSchema }, async ({ user, body, params }) => ({
  user: await updateUser(user, params.id ?? "", body),
}));
