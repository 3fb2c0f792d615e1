// `npm run db:backup [-- --out DIR]`: a consistent copy of the running embedded database (and its uploads) into
// DIR (default ./backups) as chirpdesk-<UTC time>.db and chirpdesk-<UTC time>.uploads/. Safe while the app and
// workers write.
import { parseArgs } from "node:util";
import { backupDatabase } from "@/db/backup";
import { config } from "@/lib/env";
import { loadEnvFile } from "./ensure-env";

loadEnvFile();
const { values } = parseArgs({ options: { out: { type: "string", default: "./backups" } } });
try {
  const result = await backupDatabase(config().DATABASE_URL, config().UPLOAD_DIR, values.out ?? "./backups");
  console.log(`backed up to ${result.databaseFile} (${result.bytes} bytes)${result.uploadsDir ? `, uploads to ${result.uploadsDir}` : ", no uploads"}`);
} catch (error) {
  console.error(`db:backup: ${(error as Error).message}`);
  process.exit(1);
}
