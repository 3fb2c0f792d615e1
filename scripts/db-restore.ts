// `npm run db:restore FILE`: puts a backup made by db:backup in place of an absent DATABASE_URL file (uploads saved
// beside it go into UPLOAD_DIR), then applies migrations. Stop the app and workers first; it never overwrites.
import { closeDb, getDb } from "@/db";
import { restoreDatabase } from "@/db/backup";
import { migrateDatabase } from "@/db/migrate";
import { config } from "@/lib/env";
import { loadEnvFile } from "./ensure-env";

loadEnvFile();
const file = process.argv[2];
if (!file) {
  console.error("usage: npm run db:restore -- backups/chirpdesk-<time>.db");
  process.exit(1);
}
try {
  const result = restoreDatabase(file, config().DATABASE_URL, config().UPLOAD_DIR);
  await migrateDatabase(await getDb());
  await closeDb();
  console.log(`restored ${file} to ${result.databaseFile}${result.uploads ? " with its uploads" : ""}; migrations applied`);
} catch (error) {
  console.error(`db:restore: ${(error as Error).message}`);
  process.exit(1);
}
