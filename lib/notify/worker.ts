import { loggableMessage } from "@/db/loggable-error";
import { randomUUID } from "node:crypto";
import { hostname } from "node:os";
import type { Notification } from "@/db/schema";
import { config, type Config } from "@/lib/env";
import { defaultBackoff, type BackoffOptions } from "./backoff";
import { createEmailSender, type EmailSender } from "./channels/email";
import { createPushSender, type PushSender } from "./channels/push";
import { claimDueNotifications, PAGE_LEASE_MS, recordOutcome, type Outcome } from "./claim";
import { deliver, type DeliveryContext } from "./deliver";
import { fireDueEscalations } from "./escalate";
import { queueHandoffs } from "./handoffs";

export interface WorkerOptions {
  workerId?: string;
  /** the worker's clock (Unix ms); tests inject one */
  now?: () => number;
  batchSize?: number;
  /** how long a claimed row stays with this worker; far longer than a send may take */
  leaseMs?: number;
  maxAttempts?: number;
  /** idle wait between polls of the outbox */
  pollMs?: number;
  /** sends in flight at once */
  concurrency?: number;
  /** how often to look for ended shifts to hand off (not urgent; each look is a write transaction) */
  handoffEveryMs?: number;
  backoff?: BackoffOptions;
  random?: () => number;
  push?: PushSender | null;
  email?: EmailSender | null;
  log?: (message: string) => void;
}

export interface WorkerRun {
  escalationsFired: number;
  escalationsCancelled: number;
  claimed: number;
  outcomes: Record<Outcome["status"], number>;
  /** rows whose lease another worker had taken by the time this one finished (never expected) */
  leaseLost: number;
}

/** Channel senders from the configuration (VAPID_*, SMTP_URL, MAIL_FROM); a missing one is null and its rows retry. */
export function sendersFromConfig(env: Config = config()): { push: PushSender | null; email: EmailSender | null } {
  const push =
    env.VAPID_PUBLIC_KEY && env.VAPID_PRIVATE_KEY && env.VAPID_SUBJECT
      ? createPushSender({ publicKey: env.VAPID_PUBLIC_KEY, privateKey: env.VAPID_PRIVATE_KEY, subject: env.VAPID_SUBJECT })
      : null;
  const email = env.SMTP_URL && env.MAIL_FROM ? createEmailSender({ smtpUrl: env.SMTP_URL, from: env.MAIL_FROM }) : null;
  return { push, email };
}

async function inPool<T>(items: readonly T[], width: number, fn: (item: T) => Promise<void>): Promise<void> {
  let next = 0;
  const lanes = Array.from({ length: Math.min(width, items.length) }, async () => {
    while (next < items.length) {
      const item = items[next++];
      if (item !== undefined) await fn(item);
    }
  });
  await Promise.all(lanes);
}

/** The outbox worker: fires escalation timers, sends due rows, queues shift handoffs. Several may run at once. */
export function createWorker(options: WorkerOptions = {}) {
  const workerId = options.workerId ?? `${hostname()}:${process.pid}:${randomUUID().slice(0, 8)}`;
  const now = options.now ?? Date.now;
  const batchSize = options.batchSize ?? 25;
  const leaseMs = options.leaseMs ?? 60_000;
  const pollMs = options.pollMs ?? 100;
  const concurrency = options.concurrency ?? 8;
  const log = options.log ?? ((m: string) => console.log(`[worker ${workerId}] ${m}`));
  const senders = options.push !== undefined || options.email !== undefined ? { push: options.push ?? null, email: options.email ?? null } : sendersFromConfig();
  let running = false;
  let loop: Promise<void> | null = null;
  let wake: (() => void) | null = null;
  let handoffsCheckedAt = Number.NEGATIVE_INFINITY;

  /** A send that outlives its lease would race the worker that takes the row over: cut it off first. */
  function withinLease(sending: Promise<Outcome>, row: Notification): Promise<Outcome> {
    const lease = row.kind === "page" || row.kind === "escalation" ? Math.min(leaseMs, PAGE_LEASE_MS) : leaseMs;
    const limitMs = Math.max(1_000, lease - 5_000);
    let timer: NodeJS.Timeout | undefined;
    const cutOff = new Promise<Outcome>((resolve) => {
      timer = setTimeout(
        () => resolve({ status: "retry", error: `send took over ${limitMs} ms; tried again (same message id)`, nextAttemptAt: new Date(now() + 1_000) }),
        limitMs,
      );
    });
    return Promise.race([sending, cutOff]).finally(() => clearTimeout(timer));
  }

  async function sendRow(row: Notification, run: WorkerRun): Promise<void> {
    const ctx: DeliveryContext = {
      ...senders,
      now: new Date(now()),
      maxAttempts: options.maxAttempts ?? 8,
      backoff: options.backoff ?? defaultBackoff,
      random: options.random ?? Math.random,
    };
    let outcome: Outcome;
    try {
      outcome = await withinLease(deliver(row, ctx), row);
    } catch (error) {
      outcome = { status: "retry", error: `worker error: ${String(error)}`, nextAttemptAt: new Date(now() + 5_000) };
    }
    // Marked the moment the channel answered: the only window for a repeat is a crash between these two lines.
    const kept = await recordOutcome(row, workerId, outcome, new Date(now()));
    if (!kept) run.leaseLost += 1;
    run.outcomes[outcome.status] += 1;
    if (outcome.status === "failed") log(`notification ${row.id} (${row.channel}) failed: ${outcome.error}`);
  }

  const emptyRun = (): WorkerRun => ({
    escalationsFired: 0,
    escalationsCancelled: 0,
    claimed: 0,
    outcomes: { sent: 0, skipped: 0, retry: 0, failed: 0 },
    leaseLost: 0,
  });

  async function housekeeping(run: WorkerRun): Promise<void> {
    const fired = await fireDueEscalations(workerId, new Date(now()));
    run.escalationsFired += fired.fired;
    run.escalationsCancelled += fired.cancelled;
    if (now() - handoffsCheckedAt >= (options.handoffEveryMs ?? 15_000)) {
      handoffsCheckedAt = now();
      await queueHandoffs(new Date(now()), log);
    }
  }

  /** One full cycle, waiting for every send (tests drive the worker this way with their own clock). */
  async function runOnce(): Promise<WorkerRun> {
    const run = emptyRun();
    await housekeeping(run);
    const rows = await claimDueNotifications(workerId, new Date(now()), leaseMs, batchSize);
    run.claimed = rows.length;
    await inPool(rows, concurrency, (row) => sendRow(row, run));
    return run;
  }

  /**
   * The running loop pipelines: it claims only as many rows as it has free send slots and does not wait for
   * slow sends before claiming again, so one slow SMTP exchange never holds back the next page.
   */
  const inFlight = new Set<Promise<void>>();
  async function cycle(): Promise<boolean> {
    const run = emptyRun();
    await housekeeping(run);
    const room = Math.min(batchSize, concurrency - inFlight.size);
    if (room <= 0) return false;
    const rows = await claimDueNotifications(workerId, new Date(now()), leaseMs, room);
    for (const row of rows) {
      const sending: Promise<void> = sendRow(row, run)
        .catch((error: unknown) => log(`send of ${row.id} failed: ${loggableMessage(error)}`))
        .finally(() => {
          inFlight.delete(sending);
          wake?.();
        });
      inFlight.add(sending);
    }
    return rows.length === room || run.escalationsFired > 0;
  }

  async function runLoop(): Promise<void> {
    let failures = 0;
    while (running) {
      let busy = false;
      try {
        busy = await cycle();
        failures = 0;
      } catch (error) {
        failures += 1;
        log(`cycle failed (${failures}): ${loggableMessage(error)}`);
      }
      if (!running || busy) continue;
      await new Promise<void>((resolve) => {
        const timer = setTimeout(resolve, failures > 0 ? Math.min(pollMs * 2 ** failures, 10_000) : pollMs);
        wake = () => {
          clearTimeout(timer);
          resolve();
        };
      });
      wake = null;
    }
    await Promise.allSettled([...inFlight]);
  }

  return {
    workerId,
    runOnce,
    start(): void {
      if (running) return;
      running = true;
      loop = runLoop();
    },
    async stop(): Promise<void> {
      running = false;
      wake?.();
      await loop;
      loop = null;
    },
    /** Closes the channel connections (after stop). */
    close(): void {
      senders.push?.close();
      senders.email?.close();
    },
  };
}

export type NotifyWorker = ReturnType<typeof createWorker>;
