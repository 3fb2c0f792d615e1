import concurrently, { type ConcurrentlyCommandInput } from "concurrently";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { config, servingProblems } from "@/lib/env";
import { runSeed } from "./seed";

/**
 * `npm start`: the production server on the same embedded default. Every secret comes from the environment
 * (a missing one stops here, named); migrations are applied; demo data only with SEED_DEMO=1.
 * One paging worker starts beside the server unless START_WORKER=0 (several may run at once).
 */
Object.assign(process.env, { NODE_ENV: "production" });
const problems = servingProblems(process.env);
if (problems.length > 0) {
  console.error(`Chirpdesk cannot start; fix these variables:\n${problems.map((line) => `  ${line}`).join("\n")}\nSee README.md, "Configuration".`);
  process.exit(1);
}
await migrateDatabase(await getDb());
await runSeed();
await closeDb();

const { PORT: port, START_WORKER } = config();
const commands: ConcurrentlyCommandInput[] = [{ name: "app", command: `node --import ./server/preload.mjs node_modules/next/dist/bin/next start -p ${port}` }];
if (START_WORKER !== "0") commands.push({ name: "worker", command: "tsx scripts/worker.ts" });
const { result } = concurrently(commands, { killOthersOn: ["failure", "success"], prefix: "name" });
result.then(
  () => process.exit(0),
  () => process.exit(1),
);
