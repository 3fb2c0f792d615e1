import { getServerSession } from "next-auth";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { connection } from "next/server";
import { findUserById } from "@/lib/data/accounts";
import { resolveApiToken } from "./api-tokens";
import { buildAuthOptions } from "./options";
import { hasRole, toSessionUser, type Role, type SessionUser } from "./roles";

/** Reads the person behind a user id afresh, so a role change or a disabled account applies at once. */
export async function loadSessionUser(userId: string): Promise<SessionUser | null> {
  if (!userId) return null;
  const row = await findUserById(userId);
  if (!row || row.disabledAt) return null;
  return toSessionUser(row);
}

/** The signed-in person from the session cookie, or null. */
export async function getSessionUser(): Promise<SessionUser | null> {
  // Per-request by nature: never prerendered at build time (where no secrets exist).
  await connection();
  const session = await getServerSession(buildAuthOptions());
  return session?.user?.id ? loadSessionUser(session.user.id) : null;
}

/** A bearer token wins over the cookie, so scripts never act as whoever last signed in on that machine. */
export async function resolveRequestUser(requestHeaders: Headers): Promise<SessionUser | null> {
  const authorization = requestHeaders.get("authorization");
  if (authorization) {
    const match = /^Bearer\s+(\S+)$/i.exec(authorization);
    return match?.[1] ? resolveApiToken(match[1]) : null;
  }
  // No session cookie: nothing to look up (and no request scope is needed, which keeps handlers testable).
  if (!/next-auth\.session-token=/.test(requestHeaders.get("cookie") ?? "")) return null;
  return getSessionUser();
}

/** Guards a page or server action: sends strangers to /sign-in and the wrong role to /forbidden. */
export async function requirePageUser(allowed?: readonly Role[]): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) {
    const path = (await headers()).get("x-chirpdesk-path") ?? "/";
    redirect(`/sign-in?callbackUrl=${encodeURIComponent(path)}`);
  }
  if (allowed && !hasRole(user, allowed)) redirect("/forbidden");
  return user;
}
