// A worker that dies between a send and its record, and push subscriptions whose keys cannot be used.
import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { pushSubscriptions } from "@/db/schema";
import { POST as subscribeRoute } from "@/app/api/v1/push/subscriptions/route";
import { makeSubscriptionKeys } from "@/fakes/push/decrypt";
import { createApiToken } from "@/lib/auth/api-tokens";
import { defaultBackoff } from "@/lib/notify/backoff";
import { claimDueNotifications, PAGE_LEASE_MS } from "@/lib/notify/claim";
import { deliver } from "@/lib/notify/deliver";
import { sendersFromConfig } from "@/lib/notify/worker";
import { startHarness, type Harness } from "./support/harness";

let h: Harness;
beforeAll(async () => {
  h = await startHarness();
});
afterAll(() => h.stop());

describe("a worker killed holding a page", () => {
  it("has its page sent again soon after a short lease, with the same Message-ID so the repeat is visible", async () => {
    const candidate = await h.postCandidate();
    const senders = sendersFromConfig();
    const claimedAt = new Date(h.clock.now());
    const rows = (await claimDueNotifications("doomed", claimedAt, 60_000, 50)).filter((r) => r.channel === "email" && r.candidateId === candidate.id);
    expect(rows).toHaveLength(1);
    const row = rows[0]!;
    expect(row.lockedUntil!.getTime() - claimedAt.getTime()).toBe(PAGE_LEASE_MS);
    // The doomed worker sends, then dies before recording the outcome.
    const ctx = { ...senders, now: claimedAt, maxAttempts: 8, backoff: defaultBackoff, random: () => 0.5 };
    expect((await deliver(row, ctx)).status).toBe("sent");
    h.clock.advance(PAGE_LEASE_MS + 1);
    await h.worker().runOnce();
    const mails = h.smtp.messages({ to: h.people.primary.email }).filter((m) => m.subject.includes(candidate.externalId));
    expect(mails).toHaveLength(2);
    expect(mails[0]!.messageId).toBe(mails[1]!.messageId);
    expect(h.smtp.repeats().map((m) => m.messageId)).toContain(mails[0]!.messageId);
    senders.push?.close();
    senders.email?.close();
  });
});

describe("push subscription keys", () => {
  const post = (token: string, keys: { p256dh: string; auth: string }) =>
    subscribeRoute(
      new NextRequest("http://localhost/api/v1/push/subscriptions", {
        method: "POST",
        headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
        body: JSON.stringify({ endpoint: "https://push.example.test/sub/1", keys, label: "x" }),
      }),
    );

  it("refuses a p256dh that is not a point on P-256, and an auth secret that is not 16 bytes (422 naming the key)", async () => {
    const token = (await createApiToken(h.people.primary.id, "t")).token;
    const good = makeSubscriptionKeys().keys;
    const offCurve = Buffer.from(good.p256dh, "base64url");
    offCurve[64] = offCurve[64]! ^ 0x01; // a different y: no longer on the curve
    for (const [keys, path] of [
      [{ ...good, p256dh: offCurve.toString("base64url") }, "keys.p256dh"],
      [{ ...good, p256dh: Buffer.alloc(65, 4).toString("base64url") }, "keys.p256dh"],
      [{ ...good, auth: Buffer.alloc(12).toString("base64url") }, "keys.auth"],
    ] as const) {
      const res = await post(token, keys);
      expect(res.status).toBe(422);
      expect(((await res.json()) as { issues: Array<{ path: string }> }).issues[0]?.path).toBe(path);
    }
    expect((await post(token, good)).status).toBeLessThan(300);
  });

  it("ends a stored subscription with unusable keys at the first page instead of retrying it", async () => {
    const db = await getDb();
    const good = makeSubscriptionKeys().keys;
    const [bad] = await db
      .insert(pushSubscriptions)
      .values({ userId: h.people.primary.id, endpoint: h.push.registerSubscription().endpoint, p256dh: Buffer.alloc(65, 4).toString("base64url"), auth: good.auth, label: "bad" })
      .returning();
    await h.postCandidate();
    await h.worker().runOnce();
    expect(await db.select().from(pushSubscriptions).where(eq(pushSubscriptions.id, bad!.id))).toHaveLength(0);
  });
});
