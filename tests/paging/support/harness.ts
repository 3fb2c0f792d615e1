import { and, eq } from "drizzle-orm";
import webpush from "web-push";
import { getDb } from "@/db";
import { notifications, pushSubscriptions, shifts, type Channel } from "@/db/schema";
import { makeSubscriptionKeys } from "@/fakes/push/decrypt";
import type { BrowserSubscriptionKeys } from "@/fakes/push/decrypt";
import { startFakePush, type FakePush } from "@/fakes/push/server";
import { startFakeSmtp, type FakeSmtp } from "@/fakes/smtp/server";
import type { SessionUser } from "@/lib/auth/roles";
import { putSetting } from "@/lib/data/settings";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { signFeedBody } from "@/lib/feed/signature";
import { setNotifyClock } from "@/lib/notify/clock";
import { createWorker, sendersFromConfig, type WorkerOptions } from "@/lib/notify/worker";
import { escalationPolicySchema } from "@/lib/validations/paging";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../../helpers/test-db";
import { pagingPayload } from "@/tests/support/paging-payload";

export const feedSecret = "paging-test-feed-secret-0123456789abcdef";
export const appUrl = "http://desk.chirpdesk.test";

export interface Device {
  subscriptionId: string;
  keys: BrowserSubscriptionKeys;
}

/** A throw-away database, the fakes on port 0, the env the app reads, a settable clock, three people and a shift. */
export async function startHarness(options: { startMs?: number } = {}) {
  const db: TestDatabase = await setupTestDatabase();
  const push: FakePush = await startFakePush();
  const smtp: FakeSmtp = await startFakeSmtp();
  const vapid = webpush.generateVAPIDKeys();
  const env = {
    VAPID_PUBLIC_KEY: vapid.publicKey,
    VAPID_PRIVATE_KEY: vapid.privateKey,
    VAPID_SUBJECT: "mailto:pager@chirpdesk.test",
    SMTP_URL: `smtp://127.0.0.1:${smtp.smtpPort}`,
    MAIL_FROM: "Chirpdesk pager <pager@chirpdesk.test>",
    ACK_LINK_SECRET: "paging-test-ack-secret-0123456789abcdefghij",
    APP_URL: appUrl,
    FEED_SIGNING_SECRET: feedSecret,
  };
  Object.assign(process.env, env);

  let nowMs = options.startMs ?? Date.UTC(2031, 2, 4, 12, 0, 0);
  const clock = { now: () => nowMs, set: (ms: number) => void (nowMs = ms), advance: (ms: number) => void (nowMs += ms) };
  setNotifyClock(clock.now);

  const primary = await createTestUser("shifter", { name: "Pia Primary" });
  const backup = await createTestUser("shifter", { name: "Bo Backup" });
  const coordinator = await createTestUser("coordinator", { name: "Cy Coordinator" });
  const conn = await getDb();
  const [shift] = await conn
    .insert(shifts)
    .values({ startsAt: new Date(nowMs - 3_600_000), endsAt: new Date(nowMs + 8 * 3_600_000), primaryId: primary.id, backupId: backup.id })
    .returning();

  const ingest = feedIngest.with({ now: clock.now, feedSecret: () => feedSecret });
  let posted = 0;

  return {
    db,
    push,
    smtp,
    env,
    clock,
    people: { primary, backup, coordinator },
    shiftId: shift?.id ?? "",

    /** Posts a candidate through the feed route handler (signature, validation, ingest and the paging hook). */
    async postCandidate(overrides: Parameters<typeof pagingPayload>[2] = {}): Promise<{ id: string; externalId: string }> {
      posted += 1;
      const externalId = overrides.externalId ?? `PT-${String(posted).padStart(4, "0")}`;
      // Each post its own signal (event times 10 s apart), unless the test sets eventTime to group triggers.
      const body = JSON.stringify(pagingPayload(externalId, new Date(nowMs - 20_000 - posted * 10_000), overrides));
      const res = await ingest(
        new Request("http://localhost/api/v1/feed/candidates", {
          method: "POST",
          headers: { "content-type": "application/json", ...signFeedBody(feedSecret, body, nowMs) },
          body,
        }),
      );
      const json = (await res.json()) as { id?: string; error?: string };
      if (res.status !== 201 || !json.id) throw new Error(`feed answered ${res.status}: ${JSON.stringify(json)}`);
      return { id: json.id, externalId };
    },

    /** Registers an endpoint with the fake push service and stores it as the person's device, as the subscribe route does. */
    async subscribe(user: SessionUser): Promise<Device> {
      const registered = push.registerSubscription();
      const keys = makeSubscriptionKeys();
      await (await getDb()).insert(pushSubscriptions).values({ userId: user.id, endpoint: registered.endpoint, ...keys.keys, label: "test device" });
      return { subscriptionId: registered.id, keys };
    },

    async setPolicy(overrides: Record<string, unknown>): Promise<void> {
      await putSetting("escalation", escalationPolicySchema.parse(overrides), null);
    },

    worker(options: WorkerOptions = {}) {
      return createWorker({ now: clock.now, random: () => 0.5, log: () => undefined, ...sendersFromConfig(), ...options });
    },

    async rows(filter: { userId?: string; channel?: Channel; candidateId?: string } = {}) {
      const conds = [
        filter.userId ? eq(notifications.userId, filter.userId) : undefined,
        filter.channel ? eq(notifications.channel, filter.channel) : undefined,
        filter.candidateId ? eq(notifications.candidateId, filter.candidateId) : undefined,
      ].filter((c) => c !== undefined);
      return (await getDb()).select().from(notifications).where(and(...conds));
    },

    async stop(): Promise<void> {
      setNotifyClock(null);
      await push.close();
      await smtp.close();
      await db.cleanup();
    },
  };
}

export type Harness = Awaited<ReturnType<typeof startHarness>>;

/** The acknowledge page link in a received e-mail's text part. */
export function ackLinkIn(text: string): string {
  const m = /(https?:\/\/\S+\/ack\/[^\s/]+)(?=\s)/.exec(text);
  if (!m?.[1]) throw new Error(`no acknowledge link in:\n${text}`);
  return m[1];
}
