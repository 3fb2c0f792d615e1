import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db";
import { loggableError } from "@/db/loggable-error";
import { apiTokens } from "@/db/schema";
import { PATCH as updateUserRoute } from "@/app/api/v1/users/[id]/route";
import { GET as eventsRoute } from "@/app/api/v1/events/route";
import { errorResponse } from "@/lib/api/handler";
import { createApiToken } from "@/lib/auth/api-tokens";
import { appendEvent } from "@/lib/data/events";
import { eventKinds } from "@/lib/events/kinds";
import { mayReceive } from "@/lib/events/audience";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

const patch = (token: string, body: unknown) =>
  new NextRequest("http://localhost/api/v1/users/x", {
    method: "PATCH",
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: JSON.stringify(body),
  });

describe("who manages whom", () => {
  it("a coordinator cannot reset, disable or change another coordinator or an admin; an admin can", async () => {
    const coordinator = await createTestUser("coordinator");
    const token = (await createApiToken(coordinator.id, "t")).token;
    const other = await createTestUser("coordinator");
    const admin = await createTestUser("admin");
    const shifter = await createTestUser("shifter");
    const ctx = (id: string) => ({ params: Promise.resolve({ id }) });
    for (const body of [{ password: "a-long-new-password" }, { disabled: true }, { role: "shifter" }]) {
      expect((await updateUserRoute(patch(token, body), ctx(other.id))).status, JSON.stringify(body)).toBe(403);
      expect((await updateUserRoute(patch(token, body), ctx(admin.id))).status, JSON.stringify(body)).toBe(403);
    }
    expect((await updateUserRoute(patch(token, { password: "a-long-new-password" }), ctx(shifter.id))).status).toBe(200);
    const adminToken = (await createApiToken(admin.id, "t")).token;
    expect((await updateUserRoute(patch(adminToken, { password: "a-long-new-password" }), ctx(other.id))).status).toBe(200);
  });
});

describe("the live stream's audience", () => {
  it("sends people and settings changes to those who manage them, and a failed page to coordinators and its recipient", () => {
    const observer = { id: "o1", role: "observer" as const };
    const coordinator = { id: "c1", role: "coordinator" as const };
    const failed = { kind: eventKinds.notificationFailed, data: { userId: "o1" } };
    for (const kind of [eventKinds.userChanged, eventKinds.settingsChanged]) {
      expect(mayReceive(observer, { kind, data: null })).toBe(false);
      expect(mayReceive({ id: "s", role: "shifter" }, { kind, data: null })).toBe(false);
      expect(mayReceive(coordinator, { kind, data: null })).toBe(true);
    }
    expect(mayReceive(observer, failed)).toBe(true);
    expect(mayReceive({ id: "o2", role: "observer" }, failed)).toBe(false);
    expect(mayReceive(coordinator, failed)).toBe(true);
    expect(mayReceive(observer, { kind: eventKinds.candidateCreated, data: null })).toBe(true);
  });

  it("leaves admin events out of an observer's poll while moving its cursor past them", async () => {
    const observer = await createTestUser("observer");
    const token = (await createApiToken(observer.id, "t")).token;
    const db = await getDb();
    const first = await db.transaction(async (tx) => appendEvent(tx, { kind: eventKinds.userChanged, data: { userId: "x", action: "updated" } }));
    await db.transaction(async (tx) => appendEvent(tx, { kind: eventKinds.settingsChanged, data: { key: "deadlines" } }));
    const firstId = first.id;
    const res = await eventsRoute(
      new NextRequest(`http://localhost/api/v1/events?mode=poll&after=${Math.max(0, firstId - 1)}`, { headers: { authorization: `Bearer ${token}` } }),
    );
    const body = (await res.json()) as { events: Array<{ kind: string }>; lastId: number };
    expect(body.events.map((e) => e.kind)).not.toContain(eventKinds.userChanged);
    expect(body.events.map((e) => e.kind)).not.toContain(eventKinds.settingsChanged);
    expect(body.lastId).toBeGreaterThan(Math.max(0, firstId - 1));
  });
});

describe("logs of failed writes", () => {
  it("keep the statement and the driver's error, never the parameter values (hashes of credentials)", async () => {
    const user = await createTestUser("shifter");
    const db = await getDb();
    const [existing] = await db.select().from(apiTokens).where(eq(apiTokens.userId, user.id));
    expect(existing).toBeUndefined();
    const { id } = await createApiToken(user.id, "t");
    const [row] = await db.select().from(apiTokens).where(eq(apiTokens.id, id));
    let caught: unknown;
    try {
      // the same hash again breaks the unique index: a failed write whose parameters include a token hash
      await db.insert(apiTokens).values({ userId: user.id, label: "dup", tokenHash: row!.tokenHash, prefix: "cdk_SECRET" });
    } catch (error) {
      caught = error;
    }
    expect(String((caught as Error).message)).toContain(row!.tokenHash); // what Drizzle itself would print
    const logged: string[] = [];
    const spy = vi.spyOn(console, "error").mockImplementation((...args: unknown[]) => {
      logged.push(args.map((a) => (a instanceof Error ? `${a.stack}\n${String((a as Error).cause instanceof Error ? ((a as Error).cause as Error).message : "")}` : String(a))).join(" "));
    });
    const res = errorResponse(caught, "req-1");
    spy.mockRestore();
    expect(res.status).toBe(500);
    const text = logged.join("\n");
    expect(text).toContain("insert into");
    expect(text).toMatch(/UNIQUE/);
    expect(text).not.toContain(row!.tokenHash);
    expect(text).not.toContain("cdk_SECRET");
    expect(String(loggableError(caught))).not.toContain(row!.tokenHash);
  });
});
