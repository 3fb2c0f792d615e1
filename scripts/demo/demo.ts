import { count, eq } from "drizzle-orm";
import type { Database } from "@/db";
import { instruments as instrumentsTable, shifts, siteObservers, sites, users } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { demoPeople, demoSites } from "./scenario";

export interface SeedOptions {
  now?: Date;
  /** feeds past candidates through the real ingest path when given */
  seedCandidates?: (db: Database, now: Date) => Promise<number>;
  /** imports the fictional galaxy catalogue when given */
  seedCatalogue?: (now: Date) => Promise<unknown>;
}

/** Seeds the demo scenario into an empty database; does nothing when any user exists. Never in production unless SEED_DEMO=1. */
export async function seedDemo(db: Database, options: SeedOptions = {}): Promise<{ seeded: boolean; candidates: number }> {
  const now = options.now ?? new Date();
  const [existing] = await db.select({ n: count() }).from(users);
  if ((existing?.n ?? 0) > 0) return { seeded: false, candidates: 0 };

  const hashes = new Map<string, string>();
  for (const p of demoPeople) if (!hashes.has(p.password)) hashes.set(p.password, await hashPassword(p.password));
  const people = await db
    .insert(users)
    .values(demoPeople.map(({ password, ...p }) => ({ ...p, passwordHash: hashes.get(password) ?? "" })))
    .returning();
  const byEmail = new Map(people.map((p) => [p.email, p]));

  for (const { observers, instruments, ...site } of demoSites) {
    const [row] = await db.insert(sites).values(site).returning();
    if (!row) continue;
    await db.insert(instrumentsTable).values(instruments.map((i) => ({ ...i, siteId: row.id, createdAt: now })));
    for (const email of observers) {
      const person = byEmail.get(email);
      if (person) await db.insert(siteObservers).values({ siteId: row.id, userId: person.id });
    }
  }

  // A rota around now: 8-hour shifts, Ada and Emil alternating as primary, from eight days ago to three days ahead.
  const ada = byEmail.get("ada@chirpdesk.test");
  const emil = byEmail.get("emil@chirpdesk.test");
  if (ada && emil) {
    const start = new Date(now);
    start.setUTCHours(Math.floor(start.getUTCHours() / 8) * 8 - 8 * 24, 0, 0, 0);
    const rows = Array.from({ length: 11 * 3 }, (_, i) => {
      const startsAt = new Date(start.getTime() + i * 8 * 3600_000);
      const primary = i % 2 === 0 ? ada : emil;
      const backup = i % 2 === 0 ? emil : ada;
      return { startsAt, endsAt: new Date(startsAt.getTime() + 8 * 3600_000), primaryId: primary.id, backupId: backup.id };
    });
    await db.insert(shifts).values(rows);
  }

  const candidates = options.seedCandidates ? await options.seedCandidates(db, now) : 0;
  if (options.seedCatalogue) await options.seedCatalogue(now);
  return { seeded: true, candidates };
}

export async function findUserByEmail(db: Database, email: string) {
  const [row] = await db.select().from(users).where(eq(users.email, email)).limit(1);
  return row ?? null;
}
