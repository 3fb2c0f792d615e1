import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { updateProfile } from "@/lib/data/users";
import { updateProfileSchema } from "@/lib/validations/users";

export const GET = handler({ roles: can.read }, async ({ user }) => ({ user }));

export const PATCH = handler({ roles: can.read, body: updateProfileSchema }, async ({ user, body }) => ({
  user: await updateProfile(user, body),
}));
