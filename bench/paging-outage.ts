// The outage part of `npm run bench:paging`: both outside channels down while candidates arrive, then back.
import { and, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db";
import { notifications } from "@/db/schema";
import { decryptWebPushPayload, type BrowserSubscriptionKeys } from "@/fakes/push/decrypt";
import type { FakePush } from "@/fakes/push/server";
import type { FakeSmtp } from "@/fakes/smtp/server";
import { signFeedBody } from "@/lib/feed/signature";
import { pagingPayload } from "@/tests/support/paging-payload";

interface OutageRun {
  push: FakePush;
  smtp: FakeSmtp;
  keys: BrowserSubscriptionKeys;
  ingest: (req: Request) => Promise<Response>;
  secret: string;
  primaryEmail: string;
  outageSeconds: number;
  count: number;
  row: (label: string, samples: number[]) => string;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function runOutage(o: OutageRun): Promise<void> {
  o.push.clearMessages();
  o.smtp.clear();
  console.log(`\noutage run: SMTP (421) and push (503) down for ${o.outageSeconds} s while ${o.count} candidates arrive …`);
  await o.smtp.setDown(true, { mode: "reply-421" });
  o.push.setDown(true, { status: 503 });
  const ids: string[] = [];
  const spreadMs = Math.min(o.outageSeconds * 500, 60_000);
  const started = Date.now();
  for (let i = 0; i < o.count; i++) {
    const due = started + (i * spreadMs) / o.count;
    if (due > Date.now()) await sleep(due - Date.now());
    const body = JSON.stringify(pagingPayload(`OUTAGE-${String(i).padStart(4, "0")}`, new Date(Date.now() - 10_000)));
    const res = await o.ingest(
      new Request("http://bench/api/v1/feed/candidates", { method: "POST", headers: { "content-type": "application/json", ...signFeedBody(o.secret, body, Date.now()) }, body }),
    );
    const json = (await res.json()) as { id?: string };
    if (res.status !== 201 || !json.id) throw new Error(`ingest answered ${res.status}`);
    ids.push(json.id);
  }
  await sleep(Math.max(0, started + o.outageSeconds * 1000 - Date.now()));
  const db = await getDb();
  const primaryRows = and(inArray(notifications.candidateId, ids), eq(notifications.kind, "page"));
  const failedDuring = (await db.select({ id: notifications.id }).from(notifications).where(and(primaryRows, eq(notifications.status, "failed")))).length;
  await o.smtp.setDown(false);
  o.push.setDown(false);
  const upAt = Date.now();
  const arrived = await Promise.allSettled([o.push.waitForMessages(o.count, { timeoutMs: 120_000 }), o.smtp.waitForMessages(o.count, { to: o.primaryEmail, timeoutMs: 120_000 })]);
  const pushDelay = new Map<string, number>();
  for (const m of o.push.messages()) {
    const { candidateId } = JSON.parse(decryptWebPushPayload(m.body, o.keys).toString("utf8")) as { candidateId: string };
    if (ids.includes(candidateId) && !pushDelay.has(candidateId)) pushDelay.set(candidateId, m.receivedAt.getTime() - upAt);
  }
  const mails = o.smtp.messages({ to: o.primaryEmail }).filter((m) => /OUTAGE-\d{4}/.test(m.subject));
  const mailDelay = mails.map((m) => m.receivedAt.getTime() - upAt);
  const failedAfter = (await db.select({ id: notifications.id }).from(notifications).where(and(primaryRows, eq(notifications.status, "failed")))).length;
  console.log(o.row("recovery → push stored (primary)", [...pushDelay.values()]));
  console.log(o.row("recovery → e-mail accepted (primary)", mailDelay));
  const pushIds = o.push.messages().map((m) => (JSON.parse(decryptWebPushPayload(m.body, o.keys).toString("utf8")) as { id: string }).id);
  console.log(
    `pages of the primary marked failed: ${failedDuring} during the outage, ${failedAfter} after; ` +
      `delivered: push ${pushDelay.size}/${o.count}, e-mail ${new Set(mails.map((m) => m.messageId)).size}/${o.count}; ` +
      `repeats: push ${pushIds.length - new Set(pushIds).size}, e-mail ${o.smtp.repeats().length}` +
      `${arrived.some((a) => a.status === "rejected") ? " (some never arrived within 120 s)" : ""}; target: all within 60 000 ms of recovery`,
  );
}
