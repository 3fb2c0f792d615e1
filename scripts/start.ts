import concurrently, { type ConcurrentlyCommandInput } from "concurrently";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { getEnv } from "@/lib/env";
import { runSeed } from "./seed";

/**
 * `npm start`: the production server on the same embedded default. Every secret comes from the environment
 * (a missing one stops here, named); migrations are applied; demo data only with SEED_DEMO=1.
 * One paging worker starts beside the server unless START_WORKER=0 (several may run at once).
 */
Object.assign(process.env, { NODE_ENV: "production" });
try {
  getEnv();
} catch (error) {
  console.error((error as Error).message);
  process.exit(1);
}
await migrateDatabase(await getDb());
await runSeed();
await closeDb();

const port = Number(process.env.PORT ?? 3000);
const commands: ConcurrentlyCommandInput[] = [{ name: "app", command: `node --import ./server/peer-address.mjs node_modules/next/dist/bin/next start -p ${port}` }];
if (process.env.START_WORKER !== "0") commands.push({ name: "worker", command: "tsx scripts/worker.ts" });
const { result } = concurrently(commands, { killOthersOn: ["failure", "success"], prefix: "name" });
result.then(
  () => process.exit(0),
  () => process.exit(1),
);
