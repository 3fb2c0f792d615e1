import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { loadEnvFile } from "./ensure-env";

loadEnvFile();
await migrateDatabase(await getDb());
console.log(`migrations applied to ${process.env.DATABASE_URL ?? "file:./data/chirpdesk.db"}`);
await closeDb();
