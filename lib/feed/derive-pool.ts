/**
 * The feed's physics on worker threads, so the Monte Carlo of one trigger runs beside the request loop (parsing,
 * validating and writing the next ones) instead of on it. Same function, same seed, same numbers as inline.
 *
 * Threads start on first use, are referenced only while they have work (an idle pool never keeps a script
 * alive), and take jobs least-loaded first. A thread that dies hands its jobs back to be computed inline; one that
 * dies before its first answer (no loader, a sandbox) turns the pool off for the process. `PHYSICS_THREADS` sets
 * the count: default CPUs − 1, between 1 and 4; 0 computes inline.
 */
import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";
import { config, type Config } from "@/lib/env";
import type { PhysicsSettings, TriggerPhysicsInput } from "@/lib/physics";
import { deriveForFeed } from "./derive";
import type { DeriveJob, DeriveJobResult, DerivedForFeed } from "./derive-messages";

interface Pending {
  job: DeriveJob;
  resolve: (result: DerivedForFeed) => void;
}

interface Lane {
  worker: Worker;
  inFlight: Map<number, Pending>;
  answered: boolean;
}

export function physicsThreadCount(settings: Pick<Config, "PHYSICS_THREADS"> = config()): number {
  if (settings.PHYSICS_THREADS !== undefined) return settings.PHYSICS_THREADS;
  return Math.max(1, Math.min(4, availableParallelism() - 1));
}

function inline(job: DeriveJob): DerivedForFeed {
  return deriveForFeed(job.input, job.settings, job.seed);
}

function startThread(): Worker {
  if (!config().NEXT_RUNTIME) {
    // Outside Next (tsx scripts, Vitest) the thread loads the TypeScript source through tsx's API.
    const entry = import.meta.url.replace(/derive-pool\.ts$/, "derive-thread.ts");
    const bootstrap = `import("tsx/esm/api").then(({ tsImport }) => tsImport(${JSON.stringify(entry)}, ${JSON.stringify(entry)}))`;
    return new Worker(bootstrap, { eval: true });
  }
  // A Next build compiles the thread's entry into its own chunk and rewrites this expression to load it.
  return new Worker(new URL("./derive-thread.ts", import.meta.url));
}

export class DerivePool {
  private lanes: Lane[] = [];
  private nextId = 1;
  private off = false;

  constructor(
    private readonly size: number,
    private readonly start: () => Worker = startThread,
  ) {}

  /** Whether jobs still go to threads (false once a thread failed to start, or with size 0). */
  get threaded(): boolean {
    return !this.off && this.size > 0;
  }

  run(input: TriggerPhysicsInput, settings: PhysicsSettings, seed: string): Promise<DerivedForFeed> {
    const job: DeriveJob = { id: this.nextId++, input, settings, seed };
    const lane = this.pickLane();
    if (!lane) return Promise.resolve(inline(job));
    return new Promise<DerivedForFeed>((resolve) => {
      if (lane.inFlight.size === 0) lane.worker.ref();
      lane.inFlight.set(job.id, { job, resolve });
      lane.worker.postMessage(job);
    });
  }

  async close(): Promise<void> {
    const lanes = this.lanes;
    this.lanes = [];
    this.off = true;
    await Promise.all(lanes.map((lane) => lane.worker.terminate()));
  }

  /** Threads do not work in this process: say so once, then compute inline. */
  private turnOff(reason: unknown): void {
    if (this.off) return;
    this.off = true;
    const why = reason instanceof Error ? reason.message : typeof reason === "number" ? `exit code ${reason}` : String(reason);
    console.warn(`[chirpdesk] physics threads unavailable (${why}); computing derived quantities on the request thread`);
  }

  private pickLane(): Lane | null {
    if (!this.threaded) return null;
    const idle = this.lanes.find((lane) => lane.inFlight.size === 0);
    if (idle) return idle;
    if (this.lanes.length < this.size) {
      const lane = this.startLane();
      if (lane) return lane;
    }
    let best: Lane | null = null;
    for (const lane of this.lanes) if (!best || lane.inFlight.size < best.inFlight.size) best = lane;
    return best;
  }

  private startLane(): Lane | null {
    let worker: Worker;
    try {
      worker = this.start();
    } catch (error) {
      this.turnOff(error);
      return null;
    }
    const lane: Lane = { worker, inFlight: new Map(), answered: false };
    worker.on("message", (result: DeriveJobResult) => {
      lane.answered = true;
      const pending = lane.inFlight.get(result.id);
      if (!pending) return;
      lane.inFlight.delete(result.id);
      if (lane.inFlight.size === 0) worker.unref();
      pending.resolve({ json: result.json, headline: result.headline });
    });
    let ended = false;
    const end = (reason?: unknown) => {
      if (ended) return;
      ended = true;
      this.lanes = this.lanes.filter((l) => l !== lane);
      if (!lane.answered) this.turnOff(reason);
      for (const pending of lane.inFlight.values()) pending.resolve(inline(pending.job));
      lane.inFlight.clear();
    };
    worker.on("error", end);
    worker.on("exit", end);
    this.lanes.push(lane);
    return lane;
  }
}

const globalForPool = globalThis as unknown as { chirpdeskDerivePool?: DerivePool };

/** The process's pool (kept across hot reloads in development). */
export function derivePool(): DerivePool {
  globalForPool.chirpdeskDerivePool ??= new DerivePool(physicsThreadCount());
  return globalForPool.chirpdeskDerivePool;
}
