import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { config } from "@/lib/env";
import { seedDemo } from "@/scripts/demo/demo";
import { demoPeople } from "@/scripts/demo/scenario";
import { loadEnvFile } from "./ensure-env";

/** Migrates, then seeds the demo scenario when the database is empty. Refuses in production unless SEED_DEMO=1. */
export async function runSeed(): Promise<void> {
  const { NODE_ENV, SEED_DEMO } = config();
  if (NODE_ENV === "production" && SEED_DEMO !== "1") {
    console.log("production mode: no demo data (set SEED_DEMO=1 to seed an empty database)");
    return;
  }
  const db = await getDb();
  await migrateDatabase(db);
  // The past week is fed through the fake feed's generator: loaded only when seeding, never in the `npm start` graph.
  const { seedPastCandidates } = await import("./demo/candidates");
  const { seedDemoCatalogue } = await import("./demo/galaxies");
  const result = await seedDemo(db, { seedCandidates: seedPastCandidates, seedCatalogue: seedDemoCatalogue });
  console.log(result.seeded ? `demo scenario seeded (${result.candidates} past candidates)` : "database already has users; demo seed skipped");
}

export function printDemoSignIns(url: string): void {
  console.log(`\n  Chirpdesk is starting on ${url}\n\n  Demo sign-ins (development only):`);
  for (const p of demoPeople) console.log(`    ${p.role.padEnd(12)} ${p.email.padEnd(24)} ${p.password}`);
  console.log("");
}

if (process.argv[1]?.endsWith("seed.ts")) {
  loadEnvFile();
  await runSeed();
  await closeDb();
}
