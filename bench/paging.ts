// `npm run bench:paging`: 200 candidates posted at 2 per second through the feed route handler, a paging worker
// process running, the fakes listening; prints the time from each ingest response to the push message stored
// by the fake push service and to the e-mail accepted by the fake SMTP server (p50, p99). Target p99 < 1.5 s.
// Options: --count N (200), --rate per-second (2), --poll worker poll ms (the worker's default 200).
// Then an outage run (bench/paging-outage.ts): the fake SMTP server and push service down for --outage seconds
// (90; the worst case is 600) while --outage-count candidates (40) arrive; prints pages marked failed,
// the delay of each page after recovery (target: all within 60 s), and repeats.
import { spawn } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import webpush from "web-push";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { pushSubscriptions, shifts, users } from "@/db/schema";
import { decryptWebPushPayload, makeSubscriptionKeys } from "@/fakes/push/decrypt";
import { startFakePush } from "@/fakes/push/server";
import { startFakeSmtp } from "@/fakes/smtp/server";
import { POST as ingest } from "@/app/api/v1/feed/candidates/route";
import { signFeedBody } from "@/lib/feed/signature";
import { pagingPayload } from "@/tests/support/paging-payload";
import { runOutage } from "./paging-outage";

const { values } = parseArgs({
  options: {
    count: { type: "string", default: "200" },
    rate: { type: "string", default: "2" },
    poll: { type: "string" },
    outage: { type: "string", default: "90" },
    "outage-count": { type: "string", default: "40" },
  },
});
const count = Number(values.count);
const intervalMs = 1000 / Number(values.rate);

const dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-bench-paging-"));
const push = await startFakePush();
const smtp = await startFakeSmtp();
const vapid = webpush.generateVAPIDKeys();
const env: Record<string, string> = {
  DATABASE_URL: `file:${path.join(dir, "bench.db")}`,
  VAPID_PUBLIC_KEY: vapid.publicKey,
  VAPID_PRIVATE_KEY: vapid.privateKey,
  VAPID_SUBJECT: "mailto:bench@chirpdesk.invalid",
  SMTP_URL: `smtp://127.0.0.1:${smtp.smtpPort}`,
  MAIL_FROM: "Chirpdesk bench <bench@chirpdesk.invalid>",
  ACK_LINK_SECRET: "bench-ack-link-secret-0123456789abcdefghij",
  APP_URL: "http://bench.chirpdesk.invalid",
  FEED_SIGNING_SECRET: "bench-feed-signing-secret-0123456789abcdef",
  ...(values.poll ? { WORKER_POLL_MS: values.poll } : {}),
};
Object.assign(process.env, env);

const db = await getDb();
await migrateDatabase(db);
const [primary] = await db.insert(users).values({ email: "primary@bench.invalid", name: "Bench Primary", role: "shifter", passwordHash: "-" }).returning();
if (!primary) throw new Error("no user");
await db.insert(shifts).values({ startsAt: new Date(Date.now() - 3_600_000), endsAt: new Date(Date.now() + 6 * 3_600_000), primaryId: primary.id });
const registered = push.registerSubscription();
const keys = makeSubscriptionKeys();
await db.insert(pushSubscriptions).values({ userId: primary.id, endpoint: registered.endpoint, ...keys.keys, label: "bench" });

const worker = spawn(process.execPath, ["--import", "tsx", "scripts/worker.ts"], { env: { ...process.env, ...env }, stdio: ["ignore", "pipe", "inherit"] });
await new Promise<void>((resolve) => worker.stdout?.on("data", (c: Buffer) => c.toString().includes("running") && resolve()));

const answeredAt = new Map<string, number>();
const externalOf = new Map<string, string>();
const ingestMs: number[] = [];
console.log(`posting ${count} candidates at ${values.rate}/s …`);
const started = Date.now();
for (let i = 0; i < count; i++) {
  const due = started + i * intervalMs;
  if (due > Date.now()) await new Promise((r) => setTimeout(r, due - Date.now()));
  const externalId = `BENCH-${String(i).padStart(4, "0")}`;
  const body = JSON.stringify(pagingPayload(externalId, new Date(Date.now() - 10_000)));
  const sent = Date.now();
  const res = await ingest(new Request("http://bench/api/v1/feed/candidates", { method: "POST", headers: { "content-type": "application/json", ...signFeedBody(env.FEED_SIGNING_SECRET ?? "", body, Date.now()) }, body }));
  const json = (await res.json()) as { id?: string };
  const at = Date.now();
  if (res.status !== 201 || !json.id) throw new Error(`ingest answered ${res.status}`);
  ingestMs.push(at - sent);
  answeredAt.set(json.id, at);
  externalOf.set(externalId, json.id);
}
await Promise.all([push.waitForMessages(count, { timeoutMs: 60_000 }), smtp.waitForMessages(count, { timeoutMs: 60_000 })]);

const pushLatency = push.messages().map((m) => {
  const payload = JSON.parse(decryptWebPushPayload(m.body, keys).toString("utf8")) as { candidateId: string };
  return m.receivedAt.getTime() - (answeredAt.get(payload.candidateId) ?? NaN);
});
const mailLatency = smtp.messages().map((m) => {
  const externalId = /BENCH-\d{4}/.exec(m.subject)?.[0] ?? "";
  return m.receivedAt.getTime() - (answeredAt.get(externalOf.get(externalId) ?? "") ?? NaN);
});

/** Nearest-rank percentile (common practice for latency reports). */
function percentile(sorted: number[], p: number): number {
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))] ?? NaN;
}
function row(label: string, samples: number[]): string {
  const s = [...samples].sort((a, b) => a - b);
  return `${label.padEnd(34)} n=${String(s.length).padStart(4)}  p50 ${String(percentile(s, 50)).padStart(5)} ms  p99 ${String(percentile(s, 99)).padStart(5)} ms  max ${String(s[s.length - 1]).padStart(5)} ms`;
}
console.log(row("ingest response (feed route)", ingestMs));
console.log(row("ingest response → push stored", pushLatency));
console.log(row("ingest response → e-mail accepted", mailLatency));
console.log(`duplicates: push ${pushLatency.length - count}, e-mail ${mailLatency.length - count}; target p99 < 1500 ms`);

await runOutage({
  push,
  smtp,
  keys,
  ingest,
  secret: env.FEED_SIGNING_SECRET ?? "",
  primaryEmail: primary.email,
  outageSeconds: Number(values.outage),
  count: Number(values["outage-count"]),
  row,
});

worker.kill("SIGTERM");
await new Promise((r) => worker.once("exit", r));
await push.close();
await smtp.close();
await closeDb();
rmSync(dir, { recursive: true, force: true });
