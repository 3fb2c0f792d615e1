/**
 * Fills a local database for looking at the boards: migrate, demo people, then N candidates.
 * Usage: DATABASE_URL=file:/tmp/x.db tsx tests/boards/helpers/seed-dev.ts [count]
 */
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { findUserByEmail, seedDemo } from "@/scripts/demo/demo";
import { seedBoardCandidates } from "@/tests/support/seed-board";

const count = Number(process.argv[2] ?? 40);
const db = await getDb();
await migrateDatabase(db);
await seedDemo(db);
const ada = await findUserByEmail(db, "ada@chirpdesk.test");
const started = Date.now();
await seedBoardCandidates(count, new Date(), ada ? { id: ada.id, email: ada.email, name: ada.name, role: ada.role, timeZone: ada.timeZone, initials: ada.initials } : null);
console.log(`seeded ${count} candidates in ${Date.now() - started} ms`);
await closeDb();
