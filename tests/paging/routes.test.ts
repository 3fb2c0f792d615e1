// The paging API through its route handlers, with bearer tokens: roles, validation, the on-call mute rule.
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { notifications, shifts, sites } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import type { SessionUser } from "@/lib/auth/roles";
import * as escalationRoute from "@/app/api/v1/escalation-policy/route";
import * as preferencesRoute from "@/app/api/v1/me/preferences/route";
import * as failedRoute from "@/app/api/v1/notifications/failed/route";
import * as readRoute from "@/app/api/v1/notifications/read/route";
import * as notificationsRoute from "@/app/api/v1/notifications/route";
import * as retryRoute from "@/app/api/v1/notifications/[id]/retry/route";
import * as subscriptionRoute from "@/app/api/v1/push/subscriptions/[id]/route";
import * as subscriptionsRoute from "@/app/api/v1/push/subscriptions/route";
import * as rotaItemRoute from "@/app/api/v1/rota/[id]/route";
import * as rotaRoute from "@/app/api/v1/rota/route";
import { makeSubscriptionKeys } from "@/fakes/push/decrypt";
import { queueTestPage } from "@/lib/notify/test-page";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
let shifter: SessionUser;
let onCall: SessionUser;
let coordinator: SessionUser;
const tokens = new Map<string, string>();
let siteId = "";

type Route = (req: NextRequest, ctx?: { params: Promise<Record<string, string>> }) => Promise<Response>;

async function call(route: Route, user: SessionUser, init: { method?: string; body?: unknown; query?: string; params?: Record<string, string> } = {}) {
  const req = new NextRequest(`http://localhost/api/v1/x${init.query ?? ""}`, {
    method: init.method ?? (init.body === undefined ? "GET" : "POST"),
    headers: { authorization: `Bearer ${tokens.get(user.id)}`, "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  const res = await route(req, { params: Promise.resolve(init.params ?? {}) });
  return { status: res.status, json: (await res.json()) as Record<string, unknown> };
}

const prefs = (over: Record<string, unknown> = {}) => ({
  push: true,
  email: true,
  quietStart: null,
  quietEnd: null,
  taskSiteIds: [],
  taskChannels: { push: true, email: false },
  ...over,
});

beforeAll(async () => {
  testDb = await setupTestDatabase();
  shifter = await createTestUser("shifter");
  onCall = await createTestUser("shifter");
  coordinator = await createTestUser("coordinator");
  for (const u of [shifter, onCall, coordinator]) tokens.set(u.id, (await createApiToken(u.id, "t")).token);
  const db = await getDb();
  const now = Date.now();
  await db.insert(shifts).values({ startsAt: new Date(now - 3_600_000), endsAt: new Date(now + 3_600_000), primaryId: onCall.id });
  const [site] = await db.insert(sites).values({ code: "TST", name: "Test Hill", latitudeDeg: 10, longitudeDeg: 20, elevationM: 100, fieldOfViewDeg2: 1 }).returning();
  siteId = site?.id ?? "";
});
afterAll(() => testDb.cleanup());

describe("preferences", () => {
  it("lets a person set quiet hours, channels and task sites", async () => {
    const res = await call(preferencesRoute.PUT, shifter, { method: "PUT", body: prefs({ email: false, quietStart: "23:00", quietEnd: "06:30", taskSiteIds: [siteId] }) });
    expect(res.status).toBe(200);
    expect(res.json.preferences).toMatchObject({ email: false, quietStart: "23:00", taskSiteIds: [siteId] });
    expect(res.json.onCallUntil).toBeNull();
    expect((await call(preferencesRoute.GET, shifter)).json.preferences).toMatchObject({ quietEnd: "06:30" });
  });

  it("refuses to let the on-call primary mute both channels during the shift, but allows one", async () => {
    const refused = await call(preferencesRoute.PUT, onCall, { method: "PUT", body: prefs({ push: false, email: false }) });
    expect(refused.status).toBe(422);
    expect(String(refused.json.error)).toMatch(/on-call primary/);
    expect((await call(preferencesRoute.PUT, onCall, { method: "PUT", body: prefs({ push: false }) })).status).toBe(200);
  });

  it("answers 422 naming the field for half-set quiet hours and bad times", async () => {
    const half = await call(preferencesRoute.PUT, shifter, { method: "PUT", body: prefs({ quietStart: "22:00" }) });
    expect(half.status).toBe(422);
    expect((half.json.issues as Array<{ path: string }>)[0]?.path).toBe("quietEnd");
    expect((await call(preferencesRoute.PUT, shifter, { method: "PUT", body: prefs({ quietStart: "25:00", quietEnd: "01:00" }) })).status).toBe(422);
  });
});

describe("push devices", () => {
  it("subscribes, lists without exposing the endpoint, and removes only one's own", async () => {
    const keys = makeSubscriptionKeys().keys;
    const sub = { endpoint: "https://push.example.test/push/abc123", expirationTime: null, keys, label: "Laptop" };
    const created = await call(subscriptionsRoute.POST, shifter, { body: sub });
    expect(created.status).toBe(200);
    const list = await call(subscriptionsRoute.GET, shifter);
    expect(list.json.items).toEqual([expect.objectContaining({ label: "Laptop", service: "push.example.test" })]);
    expect(JSON.stringify(list.json)).not.toContain("abc123");
    const id = String(created.json.id);
    expect((await call(subscriptionRoute.DELETE, coordinator, { method: "DELETE", params: { id } })).status).toBe(404);
    expect((await call(subscriptionRoute.DELETE, shifter, { method: "DELETE", params: { id } })).status).toBe(200);
  });

  it("refuses a subscription without proper keys", async () => {
    const res = await call(subscriptionsRoute.POST, shifter, { body: { endpoint: "https://x.test/p", keys: { p256dh: "short", auth: "x" } } });
    expect(res.status).toBe(422);
  });
});

describe("notifications", () => {
  it("lists a person's own messages with delivery states, and marks them read", async () => {
    await queueTestPage(shifter);
    const list = await call(notificationsRoute.GET, shifter);
    expect(list.json.unread).toBe(1);
    const [item] = list.json.items as Array<{ id: string; deliveries: Array<{ channel: string; status: string }> }>;
    expect(item?.deliveries.map((d) => d.channel).sort()).toEqual(["email", "push"]);
    expect((await call(notificationsRoute.GET, coordinator)).json.items).toEqual([]);
    const read = await call(readRoute.POST, shifter, { body: { ids: [item?.id] } });
    expect(read.json.unread).toBe(0);
  });

  it("shows failed messages to coordinators only, who may put them back in the outbox", async () => {
    const db = await getDb();
    const [row] = await db
      .insert(notifications)
      .values({ dedupeKey: "x:failed", userId: shifter.id, channel: "email", kind: "page", title: "T", body: "B", status: "failed", attempts: 8, nextAttemptAt: new Date(), lastError: "550 no such mailbox" })
      .returning();
    expect((await call(failedRoute.GET, shifter)).status).toBe(403);
    const failed = await call(failedRoute.GET, coordinator);
    expect(failed.json.items).toEqual([expect.objectContaining({ id: row?.id, lastError: "550 no such mailbox" })]);
    expect((await call(retryRoute.POST, coordinator, { method: "POST", params: { id: row?.id ?? "" } })).status).toBe(200);
    expect((await call(failedRoute.GET, coordinator)).json.items).toEqual([]);
  });
});

describe("rota", () => {
  const body = (startsAt: string, endsAt: string, primaryId: string, backupId: string | null = null) => ({ startsAt, endsAt, primaryId, backupId, notes: "" });

  it("lets coordinators add, change and remove shifts, and flags overlaps and gaps", async () => {
    const a = await call(rotaRoute.POST, coordinator, { body: body("2031-05-01T00:00:00Z", "2031-05-01T08:00:00Z", shifter.id, onCall.id) });
    expect(a.status).toBe(201);
    const b = await call(rotaRoute.POST, coordinator, { body: body("2031-05-01T07:00:00Z", "2031-05-01T15:00:00Z", onCall.id) });
    expect(b.status).toBe(201);
    const read = await call(rotaRoute.GET, shifter, { query: "?from=2031-05-01T00:00:00Z&to=2031-05-02T00:00:00Z" });
    expect((read.json.shifts as unknown[]).length).toBe(2);
    expect(read.json.issues).toEqual([
      { kind: "overlap", shiftIds: [a.json.id, b.json.id], from: "2031-05-01T07:00:00.000Z", to: "2031-05-01T08:00:00.000Z" },
      { kind: "gap", from: "2031-05-01T15:00:00.000Z", to: "2031-05-02T00:00:00.000Z" },
    ]);
    const moved = await call(rotaItemRoute.PUT, coordinator, { method: "PUT", params: { id: String(b.json.id) }, body: body("2031-05-01T08:00:00Z", "2031-05-02T00:00:00Z", onCall.id) });
    expect(moved.status).toBe(200);
    const again = await call(rotaRoute.GET, shifter, { query: "?from=2031-05-01T00:00:00Z&to=2031-05-02T00:00:00Z" });
    expect(again.json.issues).toEqual([]);
    expect((await call(rotaItemRoute.DELETE, coordinator, { method: "DELETE", params: { id: String(a.json.id) } })).status).toBe(200);
  });

  it("refuses shifters, backwards shifts, the same person twice, and observers on call", async () => {
    expect((await call(rotaRoute.POST, shifter, { body: body("2031-06-01T00:00:00Z", "2031-06-01T08:00:00Z", shifter.id) })).status).toBe(403);
    const backwards = await call(rotaRoute.POST, coordinator, { body: body("2031-06-01T08:00:00Z", "2031-06-01T00:00:00Z", shifter.id) });
    expect(backwards.status).toBe(422);
    expect((backwards.json.issues as Array<{ path: string }>)[0]?.path).toBe("endsAt");
    const twice = await call(rotaRoute.POST, coordinator, { body: body("2031-06-01T00:00:00Z", "2031-06-01T08:00:00Z", shifter.id, shifter.id) });
    expect((twice.json.issues as Array<{ path: string }>)[0]?.path).toBe("backupId");
    const observer = await createTestUser("observer");
    const refused = await call(rotaRoute.POST, coordinator, { body: body("2031-06-01T00:00:00Z", "2031-06-01T08:00:00Z", observer.id) });
    expect(refused.status).toBe(422);
  });
});

describe("escalation policy", () => {
  it("is read by everyone and changed by coordinators, with the defaults filled in", async () => {
    const initial = await call(escalationRoute.GET, shifter);
    expect(initial.json.steps).toEqual([
      { target: "primary", afterMinutes: 0 },
      { target: "backup", afterMinutes: 5 },
      { target: "coordinators", afterMinutes: 5 },
    ]);
    const change = { steps: [{ target: "primary", afterMinutes: 0 }, { target: "coordinators", afterMinutes: 10 }], rules: [] };
    expect((await call(escalationRoute.PUT, shifter, { method: "PUT", body: change })).status).toBe(403);
    const saved = await call(escalationRoute.PUT, coordinator, { method: "PUT", body: change });
    expect(saved.status).toBe(200);
    expect(saved.json).toMatchObject({ steps: change.steps, rules: [], nightStart: "22:00" });
    const dup = await call(escalationRoute.PUT, coordinator, { method: "PUT", body: { steps: [{ target: "primary", afterMinutes: 0 }, { target: "primary", afterMinutes: 1 }] } });
    expect(dup.status).toBe(422);
  });
});
