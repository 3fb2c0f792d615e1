import { handler } from "@/lib/api/handler";
import { ApiError } from "@/lib/api/errors";
import { revokeApiToken } from "@/lib/auth/api-tokens";
import { can } from "@/lib/auth/roles";
import { idParams } from "@/lib/validations/params";

export const DELETE = handler({ roles: can.read, params: idParams }, async ({ user, params }) => {
  if (!(await revokeApiToken(user.id, params.id))) throw new ApiError(404, "no live token with that id");
  return { revoked: true };
});
