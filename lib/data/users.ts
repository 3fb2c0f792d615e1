import { and, asc, count, eq, isNull, ne, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { users, type User } from "@/db/schema";
import { ApiError } from "@/lib/api/errors";
import { hashPassword, verifyPassword } from "@/lib/auth/password";
import type { SessionUser } from "@/lib/auth/roles";
import { eventKinds } from "@/lib/events/kinds";
import type { CreateUserInput, UpdateProfileInput, UpdateUserInput } from "@/lib/validations/users";
import { appendEvent } from "./events";

/** What lists and forms may see of a person: never the password hash. */
export type PublicUser = Omit<User, "passwordHash" | "sessionVersion">;

function toPublic({ passwordHash: _hash, sessionVersion: _version, ...rest }: User): PublicUser {
  return rest;
}

function initialsOf(name: string): string {
  return name
    .split(/\s+/)
    .filter(Boolean)
    .map((p) => p[0]?.toUpperCase() ?? "")
    .join("")
    .slice(0, 3);
}

export async function listUsers(): Promise<PublicUser[]> {
  const db = await getDb();
  return (await db.select().from(users).orderBy(asc(users.name))).map(toPublic);
}

/**
 * Coordinators manage shifters and observers (and may make new coordinators); only administrators make or change
 * administrators, and only administrators change, reset or disable another coordinator.
 */
function assertMayManage(actor: SessionUser, targetRole: User["role"], newRole?: User["role"], targetId?: string): void {
  if (actor.role === "admin") return;
  if (targetRole === "admin" || newRole === "admin") throw new ApiError(403, "only an administrator can create or change administrators");
  if (targetId !== undefined && targetId !== actor.id && targetRole === "coordinator") {
    throw new ApiError(403, "only an administrator can change, reset or disable another coordinator");
  }
}

/** Bumps the session version: every session the person holds ends (sign-in again with the new state). */
const endingSessions = { sessionVersion: sql`${users.sessionVersion} + 1` };

export async function createUser(actor: SessionUser, input: CreateUserInput): Promise<PublicUser> {
  assertMayManage(actor, input.role);
  const db = await getDb();
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (tx) => {
    const [taken] = await tx.select({ id: users.id }).from(users).where(eq(users.email, input.email)).limit(1);
    if (taken) throw new ApiError(409, `${input.email} already has an account`, { field: "email" });
    const [row] = await tx
      .insert(users)
      .values({ email: input.email, name: input.name, role: input.role, timeZone: input.timeZone, initials: initialsOf(input.name), passwordHash })
      .returning();
    if (!row) throw new Error("user insert returned nothing");
    await appendEvent(tx, { kind: eventKinds.userChanged, actorId: actor.id, toState: row.role, data: { userId: row.id, action: "created" } });
    return toPublic(row);
  });
}

export async function updateUser(actor: SessionUser, userId: string, patch: UpdateUserInput): Promise<PublicUser> {
  const db = await getDb();
  const passwordHash = patch.password ? await hashPassword(patch.password) : undefined;
  return db.transaction(async (tx) => {
    const [target] = await tx.select().from(users).where(eq(users.id, userId)).limit(1);
    if (!target) throw new ApiError(404, "user not found");
    assertMayManage(actor, target.role, patch.role, target.id);
    if (target.id === actor.id && (patch.disabled || (patch.role && patch.role !== actor.role))) {
      throw new ApiError(409, "you cannot disable yourself or change your own role; ask another coordinator or administrator");
    }
    if (target.role === "admin" && ((patch.role && patch.role !== "admin") || patch.disabled)) {
      const [others] = await tx
        .select({ n: count() })
        .from(users)
        .where(and(eq(users.role, "admin"), ne(users.id, target.id), isNull(users.disabledAt)));
      if ((others?.n ?? 0) === 0) throw new ApiError(409, "this is the last active administrator");
    }
    const [row] = await tx
      .update(users)
      .set({
        ...(patch.name ? { name: patch.name, initials: initialsOf(patch.name) } : {}),
        ...(patch.role ? { role: patch.role } : {}),
        ...(patch.timeZone ? { timeZone: patch.timeZone } : {}),
        ...(patch.disabled !== undefined ? { disabledAt: patch.disabled ? new Date() : null } : {}),
        ...(passwordHash ? { passwordHash } : {}),
        ...(passwordHash || patch.disabled || (patch.role && patch.role !== target.role) ? endingSessions : {}),
      })
      .where(eq(users.id, userId))
      .returning();
    if (!row) throw new ApiError(404, "user not found");
    await appendEvent(tx, {
      kind: eventKinds.userChanged,
      actorId: actor.id,
      fromState: target.role,
      toState: row.role,
      data: { userId, action: "updated", fields: Object.keys(patch).filter((k) => k !== "password").concat(passwordHash ? ["password"] : []) },
    });
    return toPublic(row);
  });
}

/** A person's own profile: name, time zone, password (with the current one). */
export async function updateProfile(actor: SessionUser, patch: UpdateProfileInput): Promise<PublicUser> {
  const db = await getDb();
  const [current] = await db.select().from(users).where(eq(users.id, actor.id)).limit(1);
  if (!current) throw new ApiError(404, "user not found");
  if (patch.newPassword && !(await verifyPassword(patch.currentPassword ?? "", current.passwordHash))) {
    throw new ApiError(422, "currentPassword: does not match", { issues: [{ path: "currentPassword", message: "does not match" }] });
  }
  const [row] = await db
    .update(users)
    .set({
      ...(patch.name ? { name: patch.name, initials: initialsOf(patch.name) } : {}),
      ...(patch.timeZone ? { timeZone: patch.timeZone } : {}),
      ...(patch.newPassword ? { passwordHash: await hashPassword(patch.newPassword), ...endingSessions } : {}),
    })
    .where(eq(users.id, actor.id))
    .returning();
  if (!row) throw new ApiError(404, "user not found");
  return toPublic(row);
}
