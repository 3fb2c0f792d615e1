// End-to-end over real sockets: feed route → outbox → worker → fake push service and fake SMTP server.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { escalations, events, notifications } from "@/db/schema";
import { decryptWebPushPayload } from "@/fakes/push/decrypt";
import { startHarness, type Device, type Harness } from "./support/harness";

let h: Harness;
let primaryDevice: Device;

beforeAll(async () => {
  h = await startHarness();
  primaryDevice = await h.subscribe(h.people.primary);
});
afterAll(() => h.stop());
beforeEach(() => {
  h.push.clearMessages();
  h.smtp.clear();
});

describe("a new candidate", () => {
  it("reaches the on-call primary by push and by e-mail, and in the app at once", async () => {
    const candidate = await h.postCandidate();
    const inApp = await h.rows({ userId: h.people.primary.id, channel: "in-app", candidateId: candidate.id });
    expect(inApp).toHaveLength(1);
    expect(inApp[0]?.status).toBe("sent");

    const run = await h.worker().runOnce();
    expect(run.outcomes.sent).toBe(2);

    const [message] = h.push.messages({ subscriptionId: primaryDevice.subscriptionId });
    expect(message).toBeDefined();
    const pushed = JSON.parse(decryptWebPushPayload(message?.body ?? Buffer.alloc(0), primaryDevice.keys).toString("utf8")) as Record<string, unknown>;
    expect(pushed.title).toBe(`New candidate ${candidate.externalId}`);
    expect(pushed.candidateId).toBe(candidate.id);
    expect(pushed.url).toBe(`${h.env.APP_URL}/candidates/${candidate.id}`);
    expect(String(pushed.ackUrl)).toMatch(new RegExp(`^${h.env.APP_URL}/ack/[^/]+/confirm$`));
    expect(pushed.tag).toBe(`candidate-${candidate.id}`);
    expect(message?.urgency).toBe("high");

    const mails = h.smtp.messages({ to: h.people.primary.email });
    expect(mails).toHaveLength(1);
    const mail = mails[0];
    expect(mail?.subject).toContain(candidate.externalId);
    expect(mail?.text).toContain(`${h.env.APP_URL}/candidates/${candidate.id}`);
    expect(mail?.text).toMatch(/\/ack\/\S+/);
    expect(mail?.html).toContain("Acknowledge");
    // The backup and the coordinators hear nothing while the primary's time runs.
    expect(h.smtp.messages({ to: h.people.backup.email })).toHaveLength(0);
    expect(h.smtp.messages({ to: h.people.coordinator.email })).toHaveLength(0);
    const timers = await (await getDb()).select().from(escalations).where(eq(escalations.candidateId, candidate.id));
    expect(timers.map((t) => t.target).sort()).toEqual(["backup", "coordinators"]);
  });

  it("pages nobody for a candidate the feed posts already withdrawn", async () => {
    const candidate = await h.postCandidate({ stage: "withdrawn" });
    expect(await h.rows({ candidateId: candidate.id })).toHaveLength(0);
  });

  it("drops a subscription the push service reports gone (410) and still sends the e-mail", async () => {
    const gone = await h.subscribe(h.people.primary);
    h.push.markGone(gone.subscriptionId);
    const candidate = await h.postCandidate();
    const run = await h.worker().runOnce();
    expect(run.outcomes.sent).toBe(2);
    const devices = await (await getDb()).query.pushSubscriptions.findMany({ where: (s, { eq: is }) => is(s.userId, h.people.primary.id) });
    expect(devices.map((d) => d.endpoint)).not.toContain(h.push.subscriptions().find((s) => s.id === gone.subscriptionId)?.endpoint);
    expect(h.push.messages({ subscriptionId: primaryDevice.subscriptionId })).toHaveLength(1);
    expect(h.smtp.messages({ to: h.people.primary.email })).toHaveLength(1);
    const events_ = await (await getDb()).select().from(events).where(eq(events.candidateId, candidate.id));
    expect(events_.some((e) => e.kind === "page.queued")).toBe(true);
  });
});

describe("retries", () => {
  it("delivers every e-mail once the SMTP server is back, none twice, none while it was down", async () => {
    await h.smtp.setDown(true, { mode: "reply-421" });
    const posted = [await h.postCandidate(), await h.postCandidate(), await h.postCandidate()];
    const worker = h.worker();
    for (let i = 0; i < 4; i++) {
      await worker.runOnce();
      h.clock.advance(60_000);
    }
    expect(h.smtp.messages()).toHaveLength(0);
    const waiting = (await h.rows({ channel: "email", userId: h.people.primary.id })).filter((r) => posted.some((p) => p.id === r.candidateId));
    expect(waiting.length).toBeGreaterThanOrEqual(posted.length);
    expect(waiting.every((r) => r.status === "pending" && r.attempts >= 2 && (r.lastError ?? "").includes("421"))).toBe(true);

    await h.smtp.setDown(false);
    h.clock.advance(30 * 60_000);
    const upAt = h.clock.now();
    await worker.runOnce();
    await worker.runOnce();
    // Escalation pages of earlier candidates fall due meanwhile too: every e-mail row sent since the server came
    // back must have arrived exactly once, and the three held back among them.
    const ids = h.smtp.messages().map((m) => m.headers["x-chirpdesk-notification"] ?? "");
    expect(new Set(ids).size).toBe(ids.length);
    const sentSince = (await (await getDb()).select().from(notifications).where(eq(notifications.channel, "email"))).filter(
      (r) => r.status === "sent" && (r.sentAt?.getTime() ?? 0) >= upAt,
    );
    expect(ids.sort()).toEqual(sentSince.map((r) => r.id).sort());
    for (const row of waiting) expect(ids).toContain(row.id);
  });

  it("retries a push service answering 503 and delivers once it recovers", async () => {
    h.push.setDown(true, { status: 503, retryAfterSeconds: 1 });
    const candidate = await h.postCandidate();
    const worker = h.worker();
    await worker.runOnce();
    expect(h.push.messages({ subscriptionId: primaryDevice.subscriptionId })).toHaveLength(0);
    const [waiting] = await h.rows({ userId: h.people.primary.id, channel: "push", candidateId: candidate.id });
    expect(waiting).toMatchObject({ status: "pending", attempts: 1 });
    expect(waiting?.lastError).toMatch(/503/);
    h.push.setDown(false);
    h.clock.advance(60_000);
    await worker.runOnce();
    await worker.runOnce();
    expect(h.push.messages({ subscriptionId: primaryDevice.subscriptionId })).toHaveLength(1);
    expect((await h.rows({ userId: h.people.primary.id, channel: "push", candidateId: candidate.id }))[0]?.status).toBe("sent");
  });

  it("keeps paging through an outage: never gives up on an unanswered candidate, escalates at once, shows coordinators", async () => {
    await h.smtp.setDown(true, { mode: "reply-421" });
    const candidate = await h.postCandidate();
    const worker = h.worker({ maxAttempts: 3 });
    for (let i = 0; i < 6; i++) {
      await worker.runOnce();
      h.clock.advance(31_000);
    }
    const [row] = await h.rows({ userId: h.people.primary.id, channel: "email", candidateId: candidate.id });
    // past the attempt limit of other messages, and still waiting for the next try, at most 30 s away
    expect(row).toMatchObject({ status: "pending" });
    expect(row!.attempts).toBeGreaterThan(3);
    expect(row!.nextAttemptAt.getTime() - h.clock.now()).toBeLessThanOrEqual(30_000);
    // the backup was paged long before the policy's 5 minutes (6 × 31 s here)
    const steps = await (await getDb()).select().from(escalations).where(eq(escalations.candidateId, candidate.id));
    expect(steps.find((s) => s.step === 1)?.status).toBe("fired");
    expect((await h.rows({ userId: h.people.backup.id, candidateId: candidate.id })).length).toBeGreaterThan(0);
    const failing = await (await getDb()).select().from(events).where(eq(events.kind, "page.failing"));
    expect(failing.some((e) => e.candidateId === candidate.id)).toBe(true);
    const { listFailedNotifications } = await import("@/lib/data/paging");
    const shown = (await listFailedNotifications()).find((f) => f.id === row?.id);
    expect(shown?.stillRetrying).toBe(true);
    await h.smtp.setDown(false);
    await worker.runOnce();
    h.clock.advance(31_000);
    await worker.runOnce();
    expect(h.smtp.messages({ to: h.people.primary.email }).filter((m) => m.subject.includes(candidate.externalId))).toHaveLength(1);
  });
});
