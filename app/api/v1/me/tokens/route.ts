import { NextResponse } from "next/server";
import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { createApiToken, listApiTokens } from "@/lib/auth/api-tokens";
import { can } from "@/lib/auth/roles";
import { createTokenSchema } from "@/lib/validations/users";

export const GET = handler({ roles: can.read }, async ({ user }) => ({ tokens: await listApiTokens(user.id) }));

/**
 * The token is in this answer only; the server keeps its hash. Only a signed-in person makes tokens: a token that
 * could mint tokens would let a leaked one outlive its own revocation.
 */
export const POST = handler({ roles: can.read, body: createTokenSchema }, async ({ req, user, body }) => {
  if (req.headers.get("authorization")) throw new ApiError(403, "an API token cannot make API tokens; sign in to make one");
  return NextResponse.json(await createApiToken(user.id, body.label), { status: 201 });
});
