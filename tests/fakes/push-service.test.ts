// The fake push service driven by the real `web-push` package over real sockets: delivery and
// decryption (RFC 8291), VAPID refusals (RFC 8292), and the push-service answers of RFC 8030.
import webpush from "web-push";
import type { PushSubscription, WebPushError } from "web-push";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { createFakeDevice, listFakePushMessages, markFakeSubscriptionGone, setFakePushDown } from "@/fakes/push/client";
import { decryptWebPushPayload, makeSubscriptionKeys } from "@/fakes/push/decrypt";
import { startFakePush } from "@/fakes/push/server";
import type { FakePush } from "@/fakes/push/server";
import { PlainHttpAgent, sendRequestDetails } from "./push-helpers";

const HOUR_MS = 3_600_000;
// web-push stamps exp from the wall clock (now + 12 h); the fake's clock is this reading plus an
// offset each test chooses, so the checks below depend only on differences of hours.
const clockStartMs = Date.now();
let clockOffsetMs = 0;

const vapidKeys = webpush.generateVAPIDKeys();
const vapidDetails = { subject: "mailto:pager@chirpdesk.test", ...vapidKeys };
const agent = new PlainHttpAgent();

let fake: FakePush;

function newDevice(options: { applicationServerKey?: string } = {}) {
  const registered = fake.registerSubscription(options);
  const keys = makeSubscriptionKeys();
  const subscription: PushSubscription = { endpoint: registered.endpoint, keys: keys.keys };
  return { id: registered.id, subscription, keys };
}

const statusOf = (promise: Promise<unknown>): Promise<number> =>
  promise.then(
    () => 201,
    (error: WebPushError) => error.statusCode,
  );

beforeAll(async () => {
  fake = await startFakePush({ now: () => clockStartMs + clockOffsetMs });
});
afterAll(async () => {
  agent.destroy();
  await fake.close();
});
beforeEach(() => {
  clockOffsetMs = 0;
  fake.reset();
});

describe("delivery with web-push", () => {
  it("stores the encrypted message, which decrypts with the subscription's private key", async () => {
    const device = newDevice();
    const payload = JSON.stringify({ title: "Candidate C-0042 needs triage", site: "N1" });
    const result = await webpush.sendNotification(device.subscription, payload, {
      vapidDetails,
      TTL: 120,
      urgency: "high",
      topic: "candidate-C-0042",
      agent,
    });
    expect(result.statusCode).toBe(201);
    const [message] = fake.messages({ subscriptionId: device.id });
    expect(message).toBeDefined();
    if (!message) return;
    expect(result.headers.location).toBe(message.location);
    expect(message.body.toString("utf8")).not.toContain("C-0042");
    expect(decryptWebPushPayload(message.body, device.keys).toString("utf8")).toBe(payload);
    expect(message).toMatchObject({ ttlSeconds: 120, urgency: "high", topic: "candidate-C-0042", contentEncoding: "aes128gcm" });
    expect(message.vapid).toMatchObject({ publicKey: vapidKeys.publicKey, sub: "mailto:pager@chirpdesk.test" });
    expect(message.receivedAt.getTime()).toBe(clockStartMs);
  });

  it("accepts generateRequestDetails() sent with fetch, and a payload-less push", async () => {
    const device = newDevice();
    const withBody = webpush.generateRequestDetails(device.subscription, "ping", { vapidDetails, TTL: 0 });
    expect((await sendRequestDetails(withBody)).status).toBe(201);
    const empty = webpush.generateRequestDetails(device.subscription, null, { vapidDetails, TTL: 30 });
    expect((await sendRequestDetails(empty)).status).toBe(201);
    const [first, second] = fake.messages({ subscriptionId: device.id });
    expect(first && decryptWebPushPayload(first.body, device.keys).toString("utf8")).toBe("ping");
    expect(second?.body.length).toBe(0);
    expect(second?.urgency).toBe("normal");
  });

  it("cannot reach an http:// endpoint through web-push's default https transport", async () => {
    const device = newDevice();
    await expect(webpush.sendNotification(device.subscription, "x", { vapidDetails, TTL: 60 })).rejects.toThrow(
      /wrong version number|EPROTO/i,
    );
    expect(fake.messages()).toHaveLength(0);
  });

  it("answers 413 above 4096 encrypted bytes and 201 at exactly 4096", async () => {
    const device = newDevice();
    // aes128gcm adds an 86-byte header, a 1-byte delimiter and a 16-byte tag: 3993 + 103 = 4096.
    const fits = "a".repeat(3993);
    expect(await statusOf(webpush.sendNotification(device.subscription, fits, { vapidDetails, TTL: 60, agent }))).toBe(201);
    expect(fake.messages()[0]?.body.length).toBe(4096);
    const tooBig = "a".repeat(3994);
    expect(await statusOf(webpush.sendNotification(device.subscription, tooBig, { vapidDetails, TTL: 60, agent }))).toBe(413);
    expect(fake.messages()).toHaveLength(1);
  });
});

describe("VAPID checks (RFC 8292)", () => {
  const send = (subscription: PushSubscription, details = vapidDetails) =>
    statusOf(webpush.sendNotification(subscription, "hello", { vapidDetails: details, TTL: 60, agent }));

  it("refuses a JWT signed with a key other than k", async () => {
    const other = webpush.generateVAPIDKeys();
    const device = newDevice();
    expect(await send(device.subscription, { ...vapidDetails, privateKey: other.privateKey })).toBe(403);
    expect(fake.messages()).toHaveLength(0);
  });

  it("refuses an expired JWT and one expiring more than 24 h ahead, accepts 23 h ahead", async () => {
    const device = newDevice();
    clockOffsetMs = 13 * HOUR_MS; // web-push's exp (now + 12 h) is an hour in the fake's past
    expect(await send(device.subscription)).toBe(403);
    clockOffsetMs = -13 * HOUR_MS; // exp is 25 h in the fake's future
    expect(await send(device.subscription)).toBe(403);
    clockOffsetMs = -11 * HOUR_MS; // exp is 23 h ahead
    expect(await send(device.subscription)).toBe(201);
  });

  it("refuses an explicitly expired token and a token for another audience", async () => {
    const device = newDevice();
    const nowSeconds = Math.floor(clockStartMs / 1000);
    const details = webpush.generateRequestDetails(device.subscription, "hello", { vapidDetails, TTL: 60 });
    const authorization = (audience: string, exp: number) =>
      webpush.getVapidHeaders(audience, vapidDetails.subject, vapidKeys.publicKey, vapidKeys.privateKey, "aes128gcm", exp)
        .Authorization;
    const expired = await sendRequestDetails(details, { authorization: authorization(fake.url, nowSeconds - 60) });
    expect(expired.status).toBe(403);
    const wrongAud = await sendRequestDetails(details, { authorization: authorization("http://127.0.0.1:9", nowSeconds + 600) });
    expect(wrongAud.status).toBe(403);
    expect(await wrongAud.json()).toMatchObject({ error: expect.stringMatching(/aud/) });
    const good = await sendRequestDetails(details, { authorization: authorization(fake.url, nowSeconds + 600) });
    expect(good.status).toBe(201);
  });

  it("answers 401 with WWW-Authenticate when the credentials are missing or not vapid", async () => {
    const device = newDevice();
    const details = webpush.generateRequestDetails(device.subscription, "hello", { vapidDetails, TTL: 60 });
    const missing = await sendRequestDetails(details, { authorization: null });
    expect(missing.status).toBe(401);
    expect(missing.headers.get("www-authenticate")).toBe("vapid");
    const legacy = await sendRequestDetails(details, { authorization: "WebPush abc.def.ghi" });
    expect(legacy.status).toBe(401);
  });

  it("lets only the applicationServerKey of a restricted subscription send", async () => {
    const device = newDevice({ applicationServerKey: vapidKeys.publicKey });
    const other = webpush.generateVAPIDKeys();
    expect(await send(device.subscription, { ...vapidDetails, ...other })).toBe(403);
    expect(await send(device.subscription)).toBe(201);
  });
});

describe("push-service answers (RFC 8030)", () => {
  it("answers 404 for an unknown subscription and 410 once the admin API marks it gone", async () => {
    const unknown: PushSubscription = { endpoint: `${fake.url}/push/no-such-id`, keys: makeSubscriptionKeys().keys };
    const notFound = webpush.sendNotification(unknown, "x", { vapidDetails, TTL: 60, agent });
    await expect(notFound).rejects.toMatchObject({ statusCode: 404 });

    const device = await createFakeDevice(fake.url);
    const send = () => webpush.sendNotification(device.subscription, "x", { vapidDetails, TTL: 60, agent });
    expect((await send()).statusCode).toBe(201);
    await markFakeSubscriptionGone(fake.url, device.subscriptionId);
    await expect(send()).rejects.toMatchObject({ statusCode: 410 });
    expect(fake.messages()).toHaveLength(1);
  });

  it("answers 400 to missing TTL, unknown Urgency, a bad Topic and a non-aes128gcm body", async () => {
    const device = newDevice();
    const details = webpush.generateRequestDetails(device.subscription, "hello", { vapidDetails, TTL: 60 });
    const overrides: Record<string, string | null>[] = [
      { ttl: null },
      { ttl: "-5" },
      { urgency: "urgent" },
      { topic: "this-topic-is-far-longer-than-32-characters" },
      { topic: "no spaces" },
      { "content-encoding": "aesgcm" },
    ];
    const statuses = await Promise.all(
      overrides.map(async (override) => (await sendRequestDetails(details, override)).status),
    );
    expect(statuses).toEqual([400, 400, 400, 400, 400, 400]);
    const garbage = await sendRequestDetails({ ...details, body: Buffer.alloc(40, 1) });
    expect(garbage.status).toBe(400);
    expect(fake.messages()).toHaveLength(0);
  });

  it("answers the outage status with Retry-After while down, and delivers again afterwards", async () => {
    const device = await createFakeDevice(fake.url);
    const send = () => webpush.sendNotification(device.subscription, "retry me", { vapidDetails, TTL: 60, agent });
    await setFakePushDown(fake.url, true, { retryAfterSeconds: 5 });
    await expect(send()).rejects.toMatchObject({ statusCode: 503, headers: { "retry-after": "5" } });
    fake.setDown(true, { status: 429 });
    await expect(send()).rejects.toMatchObject({ statusCode: 429 });
    await setFakePushDown(fake.url, false);
    expect((await send()).statusCode).toBe(201);
    const stored = await listFakePushMessages(fake.url, { subscription: device.subscriptionId });
    expect(stored).toHaveLength(1);
    const body = Buffer.from(stored[0]?.body ?? "", "base64url");
    expect(decryptWebPushPayload(body, { privateKey: device.privateKey, auth: device.subscription.keys.auth }).toString()).toBe(
      "retry me",
    );
  });

  it("lists messages after a seq or since an instant, and clears them", async () => {
    const device = newDevice();
    const send = (text: string) => webpush.sendNotification(device.subscription, text, { vapidDetails, TTL: 60, agent });
    await send("first");
    clockOffsetMs = 5_000;
    await send("second");
    // seq keeps counting across resets so a reader's `after` cursor never goes back.
    const all = await listFakePushMessages(fake.url);
    const [first, second] = all.map((m) => m.seq);
    expect(all).toHaveLength(2);
    expect(second).toBe((first ?? 0) + 1);
    expect((await listFakePushMessages(fake.url, { after: first })).map((m) => m.seq)).toEqual([second]);
    const sinceIso = new Date(clockStartMs + 1_000).toISOString();
    expect((await listFakePushMessages(fake.url, { since: sinceIso })).map((m) => m.seq)).toEqual([second]);
    expect((await listFakePushMessages(fake.url, { since: clockStartMs })).map((m) => m.seq)).toEqual([second]);
    expect((await fetch(`${fake.url}/_admin/messages?since=yesterday`)).status).toBe(400);
    expect((await fetch(`${fake.url}/_admin/messages`, { method: "DELETE" })).status).toBe(204);
    expect(await listFakePushMessages(fake.url)).toEqual([]);
  });

  it("waitForMessages resolves when the awaited messages arrive", async () => {
    const device = newDevice();
    const waiting = fake.waitForMessages(2, { subscriptionId: device.id, timeoutMs: 5_000 });
    for (const text of ["one", "two"]) {
      await webpush.sendNotification(device.subscription, text, { vapidDetails, TTL: 60, agent });
    }
    const got = await waiting;
    expect(got.map((m) => decryptWebPushPayload(m.body, device.keys).toString())).toEqual(["one", "two"]);
  });
});
