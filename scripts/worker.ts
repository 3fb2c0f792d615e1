// `npm run worker` (tsx scripts/worker.ts): the paging outbox worker, until SIGINT/SIGTERM.
// Several may run at once against one database. Tuning: WORKER_POLL_MS, WORKER_LEASE_MS, WORKER_BATCH,
// WORKER_CONCURRENCY (sends in flight), WORKER_ID.
import { closeDb } from "@/db";
import { loadEnvFile } from "./ensure-env";
import { config } from "@/lib/env";
import { createWorker } from "@/lib/notify/worker";

loadEnvFile();

const settings = config();
const worker = createWorker({
  workerId: settings.WORKER_ID,
  pollMs: settings.WORKER_POLL_MS,
  leaseMs: settings.WORKER_LEASE_MS,
  batchSize: settings.WORKER_BATCH,
  concurrency: settings.WORKER_CONCURRENCY,
});
worker.start();
console.log(`paging worker ${worker.workerId} running`);

let stopping = false;
async function stop(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  await worker.stop();
  worker.close();
  await closeDb();
  console.log(`paging worker stopped (${signal})`);
  process.exit(0);
}
process.once("SIGINT", () => void stop("SIGINT"));
process.once("SIGTERM", () => void stop("SIGTERM"));
