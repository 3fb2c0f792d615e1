// `npm run worker` (tsx scripts/worker.ts): the paging outbox worker, until SIGINT/SIGTERM.
// Several may run at once against one database. Tuning: WORKER_POLL_MS, WORKER_LEASE_MS, WORKER_BATCH,
// WORKER_CONCURRENCY (sends in flight), WORKER_ID.
import { closeDb } from "@/db";
import { loadEnvFile } from "./ensure-env";
import { createWorker } from "@/lib/notify/worker";

loadEnvFile();

function positive(name: string): number | undefined {
  const raw = process.env[name];
  if (raw === undefined || raw === "") return undefined;
  const value = Number(raw);
  if (!Number.isFinite(value) || value <= 0) throw new Error(`${name}=${raw} must be a positive number`);
  return value;
}

const worker = createWorker({
  workerId: process.env.WORKER_ID || undefined,
  pollMs: positive("WORKER_POLL_MS"),
  leaseMs: positive("WORKER_LEASE_MS"),
  batchSize: positive("WORKER_BATCH"),
  concurrency: positive("WORKER_CONCURRENCY"),
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
