/**
 * A physics thread (see lib/feed/derive-pool.ts): answers each { id, input, settings, seed } with { id, json,
 * headline }. deriveForFeed never throws, so every job gets an answer.
 */
import { parentPort } from "node:worker_threads";
import { deriveForFeed } from "./derive";
import type { DeriveJob, DeriveJobResult } from "./derive-messages";

parentPort?.on("message", (job: DeriveJob) => {
  const result: DeriveJobResult = { id: job.id, ...deriveForFeed(job.input, job.settings, job.seed) };
  parentPort?.postMessage(result);
});
