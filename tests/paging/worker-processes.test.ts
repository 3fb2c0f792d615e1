// Worker processes over real sockets: killed mid-batch and restarted, and two running at once.
import { spawn, type ChildProcess } from "node:child_process";
import { inArray } from "drizzle-orm";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { notifications } from "@/db/schema";
import { decryptWebPushPayload } from "@/fakes/push/decrypt";
import { startHarness, type Device, type Harness } from "./support/harness";

let h: Harness;
let device: Device;
const children = new Set<ChildProcess>();

// The child workers read the wall clock, so this file's clock starts at the wall clock too.
beforeAll(async () => {
  h = await startHarness({ startMs: Date.now() });
  device = await h.subscribe(h.people.primary);
});
afterEach(() => {
  for (const child of children) if (child.exitCode === null) child.kill("SIGKILL");
  children.clear();
});
afterAll(() => h.stop());

/** A worker process; its SMTP user name is its id, which the fake SMTP server records on each message. */
function startWorker(id: string, tuning: Record<string, string> = {}): { child: ChildProcess; ready: Promise<void> } {
  const smtpUrl = h.env.SMTP_URL.replace("smtp://", `smtp://${id}:pw@`);
  // node with tsx's loader, not the tsx launcher: the launcher runs the script in a grandchild a SIGKILL would miss.
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts"], {
    env: { ...process.env, ...h.env, SMTP_URL: smtpUrl, DATABASE_URL: h.db.url, WORKER_ID: id, WORKER_POLL_MS: "50", WORKER_LEASE_MS: "1500", WORKER_BATCH: "10", ...tuning },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stderr?.on("data", (c: Buffer) => process.stderr.write(`[${id}] ${c.toString()}`));
  children.add(child);
  const ready = new Promise<void>((resolve) => child.stdout?.on("data", (c: Buffer) => c.toString().includes("running") && resolve()));
  return { child, ready };
}

/** Notification ids that arrived, one entry per delivery (duplicates kept). */
function deliveredIds(): string[] {
  const mail = h.smtp.messages().map((m) => m.headers["x-chirpdesk-notification"] ?? "?");
  const pushed = h.push
    .messages({ subscriptionId: device.subscriptionId })
    .map((m) => (JSON.parse(decryptWebPushPayload(m.body, device.keys).toString("utf8")) as { id: string }).id);
  return [...mail, ...pushed];
}

async function waitUntil(condition: () => Promise<boolean>, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await condition())) {
    if (Date.now() > deadline) throw new Error("timed out");
    await new Promise((r) => setTimeout(r, 100));
  }
}

async function postMany(n: number): Promise<string[]> {
  const ids: string[] = [];
  for (let i = 0; i < n; i++) ids.push((await h.postCandidate()).id);
  const rows = await (await getDb()).select().from(notifications).where(inArray(notifications.candidateId, ids));
  return rows.filter((r) => r.channel !== "in-app").map((r) => r.id);
}

async function allSent(rowIds: string[]): Promise<boolean> {
  const rows = await (await getDb()).select().from(notifications).where(inArray(notifications.id, rowIds));
  return rows.every((r) => r.status === "sent");
}

describe("worker processes", () => {
  it("loses nothing when a worker is killed mid-batch (SIGKILL) and another starts", async () => {
    h.push.clearMessages();
    h.smtp.clear();
    const rowIds = await postMany(15);
    const { child: first } = startWorker("doomed");
    await new Promise<void>((resolve) => {
      const stopListening: Array<() => unknown> = [];
      const kill = () => {
        first.kill("SIGKILL");
        for (const stop of stopListening) stop();
        resolve();
      };
      stopListening.push(h.smtp.onMessage(kill), h.push.onMessage(kill));
    });
    await new Promise((r) => first.once("exit", r));
    const atKill = await (await getDb()).select().from(notifications).where(inArray(notifications.id, rowIds));
    const unfinished = atKill.filter((r) => r.status !== "sent");
    expect(unfinished.length).toBeGreaterThan(0);

    startWorker("successor");
    await waitUntil(() => allSent(rowIds));
    const delivered = deliveredIds();
    for (const id of rowIds) expect(delivered).toContain(id);
    // At least once: only rows the killed worker held could arrive twice (sent, not yet marked).
    const repeats = delivered.length - new Set(delivered).size;
    expect(repeats).toBeLessThanOrEqual(atKill.filter((r) => r.status === "sending").length);
  });

  it("two workers at once never send the same row twice", async () => {
    h.push.clearMessages();
    h.smtp.clear();
    // Both poll before the rows exist, so every new row is raced for; two sends in flight each at most, so
    // neither can take everything even on a loaded machine.
    const narrow = { WORKER_BATCH: "2", WORKER_CONCURRENCY: "2" };
    await Promise.all([startWorker("left", narrow).ready, startWorker("right", narrow).ready]);
    const rowIds = await postMany(20);
    await waitUntil(() => allSent(rowIds));
    const delivered = deliveredIds();
    expect(delivered.sort()).toEqual([...rowIds].sort());
    const senders = h.smtp.messages().map((m) => m.authUser);
    expect(new Set(senders)).toEqual(new Set(["left", "right"]));
  });
});
