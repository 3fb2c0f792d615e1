import { NextResponse } from "next/server";
import { handler } from "@/lib/api/handler";
import { can } from "@/lib/auth/roles";
import { createUser, listUsers } from "@/lib/data/users";
import { createUserSchema } from "@/lib/validations/users";

export const GET = handler({ roles: can.manageUsers }, async () => ({ users: await listUsers() }));

export const POST = handler({ roles: can.manageUsers, body: createUserSchema }, async ({ user, body }) =>
  NextResponse.json({ user: await createUser(user, body) }, { status: 201 }),
);
