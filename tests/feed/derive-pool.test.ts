import { Worker } from "node:worker_threads";
import { afterEach, describe, expect, it } from "vitest";
import { deriveForFeed } from "@/lib/feed/derive";
import { DerivePool, physicsThreadCount } from "@/lib/feed/derive-pool";
import { parseConfig } from "@/lib/env";
import { derivationSeed, toPhysicsInput } from "@/lib/feed/physics-input";
import { defaultPhysicsSettings } from "@/lib/physics";
import { samplePayload } from "./support/feed-helpers";

const receivedAt = new Date("2026-12-01T04:12:30.000Z");
const jobs = [
  samplePayload(),
  samplePayload({ masses: { m1: { mean: 9, sd: 1.5 }, m2: { mean: 1.4, sd: 0.2 } }, spins: { chi1: 0.4, chi2: 0 } }),
  samplePayload({ masses: { m1: { mean: 36, sd: 4 }, m2: { mean: 29, sd: 4 } }, distanceMpc: { mean: 900, sd: 250 } }),
  samplePayload({ frequencyTrack: { t: [0, 1], f: [30, 20] } }),
].map((payload) => ({ input: toPhysicsInput(payload, receivedAt), seed: derivationSeed(payload) }));

const pools: DerivePool[] = [];
function pool(size: number, start?: () => Worker): DerivePool {
  const created = new DerivePool(size, start);
  pools.push(created);
  return created;
}
afterEach(async () => {
  await Promise.all(pools.splice(0).map((p) => p.close()));
});

describe("the feed's physics threads", () => {
  it("give exactly the inline numbers, including failures, for many jobs in flight at once", async () => {
    const threaded = pool(2);
    const repeated = Array.from({ length: 5 }, () => jobs).flat();
    const results = await Promise.all(repeated.map((job) => threaded.run(job.input, defaultPhysicsSettings, job.seed)));
    expect(threaded.threaded).toBe(true);
    results.forEach((result, index) => {
      const job = repeated[index]!;
      expect(result).toEqual(deriveForFeed(job.input, defaultPhysicsSettings, job.seed));
    });
    // The bad track (frequency falling) is a typed failure inside the JSON, not a lost job.
    expect(JSON.parse(results[3]!.json).chirpMass).toBeNull();
  });

  it("compute inline, and stop trying threads, when a thread cannot start", async () => {
    const broken = pool(1, () => new Worker("throw new Error('no loader here')", { eval: true }));
    const job = jobs[0]!;
    const result = await broken.run(job.input, defaultPhysicsSettings, job.seed);
    expect(result).toEqual(deriveForFeed(job.input, defaultPhysicsSettings, job.seed));
    expect(broken.threaded).toBe(false);
  });

  it("recompute inline the jobs of a thread that dies while holding them", async () => {
    let started = 0;
    const dying = pool(1, () => {
      started += 1;
      return new Worker("require('node:worker_threads').parentPort.once('message', () => process.exit(3))", { eval: true });
    });
    const results = await Promise.all(jobs.slice(0, 3).map((job) => dying.run(job.input, defaultPhysicsSettings, job.seed)));
    results.forEach((result, index) => {
      const job = jobs[index]!;
      expect(result).toEqual(deriveForFeed(job.input, defaultPhysicsSettings, job.seed));
    });
    expect(started).toBe(1);
  });

  it("read PHYSICS_THREADS: a count, 0 for inline, nonsense refused by name, unset as CPUs − 1 within 1…4", () => {
    expect(physicsThreadCount(parseConfig({ PHYSICS_THREADS: "3" }))).toBe(3);
    expect(physicsThreadCount(parseConfig({ PHYSICS_THREADS: "0" }))).toBe(0);
    expect(() => parseConfig({ PHYSICS_THREADS: "two" })).toThrow(/PHYSICS_THREADS/);
    const fallback = physicsThreadCount(parseConfig({}));
    expect(fallback).toBeGreaterThanOrEqual(1);
    expect(fallback).toBeLessThanOrEqual(4);
  });
});
