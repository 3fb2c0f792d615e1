import { existsSync } from "node:fs";
import concurrently, { type ConcurrentlyCommandInput } from "concurrently";
import { closeDb } from "@/db";
import { ensureEnvFile, loadEnvFile } from "./ensure-env";
import { printDemoSignIns, runSeed } from "./seed";

/**
 * `npm run dev`: secrets into .env.local when absent, migrations, demo seed on an empty database,
 * then the app, the paging worker, the local fakes and a gentle fake feed, in one terminal.
 */
const port = Number(process.env.PORT ?? 3000);
ensureEnvFile(".env.local", port);
loadEnvFile();
process.env.APP_URL ??= `http://localhost:${port}`;

await runSeed();
await closeDb();
printDemoSignIns(process.env.APP_URL);

const commands: ConcurrentlyCommandInput[] = [
  { name: "app", command: `node --import ./server/preload.mjs node_modules/next/dist/bin/next dev -p ${port}`, prefixColor: "blue" },
];
if (existsSync("fakes/run-all.ts")) commands.push({ name: "fakes", command: "tsx fakes/run-all.ts", prefixColor: "magenta" });
if (existsSync("scripts/worker.ts")) commands.push({ name: "worker", command: "tsx scripts/worker.ts", prefixColor: "green" });
if (existsSync("fakes/feed/cli.ts") && process.env.DEV_FEED !== "0") {
  commands.push({
    name: "feed",
    command: `tsx fakes/feed/cli.ts --rate ${process.env.DEV_FEED_RATE ?? "6/h"} --scenario gentle --url ${process.env.APP_URL}`,
    prefixColor: "yellow",
  });
}

const { result } = concurrently(commands, { killOthersOn: ["failure"], prefix: "name" });
result.then(
  () => process.exit(0),
  () => process.exit(1),
);
