import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { createApiToken, listApiTokens } from "@/lib/auth/api-tokens";
import { can } from "@/lib/auth/roles";
import { createTokenSchema } from "@/lib/validations/users";

export const GET = handler({ roles: can.read }, async ({ user }) => ({ tokens: await listApiTokens(user.id) }));

/** The token is in this answer only; the server keeps its hash. */
export const POST = handler({ roles: can.read, body: createTokenSchema }, async ({ user, body }) =>
  NextResponse.json(await createApiToken(user.id, body.label), { status: 201 }),
);
