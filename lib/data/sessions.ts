import { eq, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { users, type Role } from "@/db/schema";

type Writer = Pick<Awaited<ReturnType<typeof getDb>>, "update">;

export interface SessionState {
  role: Role;
  name: string;
  disabled: boolean;
  sessionVersion: number;
}

/** What a session needs to know of its person on every use. */
export async function readSessionState(userId: string): Promise<SessionState | null> {
  const db = await getDb();
  const [row] = await db
    .select({ role: users.role, name: users.name, disabledAt: users.disabledAt, sessionVersion: users.sessionVersion })
    .from(users)
    .where(eq(users.id, userId))
    .limit(1);
  return row ? { role: row.role, name: row.name, disabled: !!row.disabledAt, sessionVersion: row.sessionVersion } : null;
}

/** Ends every session of the person (on every device); pass the transaction that made the change when there is one. */
export async function endSessions(userId: string, writer?: Writer): Promise<void> {
  const db = writer ?? (await getDb());
  await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}
