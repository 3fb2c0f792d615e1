import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { users, type Role } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import type { SessionUser } from "@/lib/auth/roles";

export interface TestDatabase {
  url: string;
  dir: string;
  cleanup(): Promise<void>;
}

/** A throw-away SQLite file, migrated, and made the process database (DATABASE_URL). */
export async function setupTestDatabase(): Promise<TestDatabase> {
  const dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-test-"));
  const url = `file:${path.join(dir, "test.db")}`;
  await closeDb();
  process.env.DATABASE_URL = url;
  await migrateDatabase(await getDb());
  return {
    url,
    dir,
    async cleanup() {
      await closeDb();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

let userCounter = 0;

/** Inserts a user; the password is "pw-<role>" unless given. Hashing at low cost keeps tests quick. */
export async function createTestUser(role: Role, overrides: { email?: string; name?: string; password?: string } = {}) {
  userCounter += 1;
  const db = await getDb();
  const email = overrides.email ?? `${role}${userCounter}@example.test`;
  const [row] = await db
    .insert(users)
    .values({
      email,
      name: overrides.name ?? `Test ${role} ${userCounter}`,
      role,
      initials: role.slice(0, 2).toUpperCase(),
      passwordHash: await hashPassword(overrides.password ?? `pw-${role}`),
    })
    .returning();
  if (!row) throw new Error("user insert returned nothing");
  const user: SessionUser = {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    timeZone: row.timeZone,
    initials: row.initials,
  };
  return user;
}
