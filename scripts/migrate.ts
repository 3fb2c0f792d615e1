import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { config } from "@/lib/env";
import { loadEnvFile } from "./ensure-env";

loadEnvFile();
await migrateDatabase(await getDb());
console.log(`migrations applied to ${config().DATABASE_URL}`);
await closeDb();
