import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { NextRequest } from "next/server";
import { GET as listUsersRoute, POST as createUserRoute } from "@/app/api/v1/users/route";
import { PATCH as updateUserRoute } from "@/app/api/v1/users/[id]/route";
import { createApiToken } from "@/lib/auth/api-tokens";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
const tokens: Record<string, string> = {};
const ids: Record<string, string> = {};
beforeAll(async () => {
  testDb = await setupTestDatabase();
  for (const role of ["shifter", "coordinator", "admin"] as const) {
    const u = await createTestUser(role);
    ids[role] = u.id;
    tokens[role] = (await createApiToken(u.id, "t")).token;
  }
});
afterAll(() => testDb.cleanup());

const req = (method: string, token: string, body?: unknown) =>
  new NextRequest("http://localhost/api/v1/users", {
    method,
    headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
const ctx = (id: string) => ({ params: Promise.resolve({ id }) });

describe("people and roles", () => {
  it("lists people without password hashes, for coordinators only", async () => {
    const res = await listUsersRoute(req("GET", tokens.coordinator!));
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.users.length).toBeGreaterThanOrEqual(3);
    expect(JSON.stringify(body)).not.toMatch(/password|\$2[aby]\$/i);
    expect((await listUsersRoute(req("GET", tokens.shifter!))).status).toBe(403);
  });

  it("creates a person, refusing a taken e-mail with 409 and a bad field with 422", async () => {
    const input = { email: "new.person@example.test", name: "New Person", role: "observer", timeZone: "Europe/Lisbon", password: "long-enough-pw" };
    const created = await createUserRoute(req("POST", tokens.coordinator!, input));
    expect(created.status).toBe(201);
    expect((await createUserRoute(req("POST", tokens.coordinator!, input))).status).toBe(409);
    const bad = await createUserRoute(req("POST", tokens.coordinator!, { ...input, email: "x@example.test", timeZone: "Mars/Olympus" }));
    expect(bad.status).toBe(422);
    expect((await bad.json()).issues[0].path).toBe("timeZone");
  });

  it("lets only administrators make administrators", async () => {
    const input = { email: "boss@example.test", name: "Boss", role: "admin", password: "long-enough-pw" };
    expect((await createUserRoute(req("POST", tokens.coordinator!, input))).status).toBe(403);
    expect((await createUserRoute(req("POST", tokens.admin!, input))).status).toBe(201);
  });

  it("refuses to let people disable themselves", async () => {
    const res = await updateUserRoute(req("PATCH", tokens.coordinator!, { disabled: true }), ctx(ids.coordinator!));
    expect(res.status).toBe(409);
  });

  it("applies a role change at once: the next call with the same token has the new role", async () => {
    const target = await createTestUser("shifter");
    const token = (await createApiToken(target.id, "t")).token;
    expect((await listUsersRoute(req("GET", token))).status).toBe(403);
    expect((await updateUserRoute(req("PATCH", tokens.admin!, { role: "coordinator" }), ctx(target.id))).status).toBe(200);
    expect((await listUsersRoute(req("GET", token))).status).toBe(200);
  });
});
