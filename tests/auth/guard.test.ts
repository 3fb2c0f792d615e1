import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { z } from "zod";
import { ApiError } from "@/lib/api/errors";
import { handler } from "@/lib/api/handler";
import { createApiToken, revokeApiToken } from "@/lib/auth/api-tokens";
import { can } from "@/lib/auth/roles";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  testDb = await setupTestDatabase();
  for (const role of ["shifter", "observer", "coordinator", "admin"] as const) {
    const user = await createTestUser(role);
    tokens[role] = (await createApiToken(user.id, "test")).token;
  }
});
afterAll(() => testDb.cleanup());

const route = handler({ roles: can.triage, body: z.object({ reason: z.string().min(3) }) }, async ({ user, body }) => ({
  by: user.role,
  reason: body.reason,
}));

function post(body: string, token?: string) {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (token) headers.authorization = `Bearer ${token}`;
  return route(new NextRequest("http://localhost/api/v1/x", { method: "POST", body, headers }));
}

describe("the route guard", () => {
  it("answers 401 JSON without a session or token", async () => {
    const res = await post(JSON.stringify({ reason: "abc" }));
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/sign in/);
  });

  it("answers 401 for an unknown token", async () => {
    expect((await post("{}", "cdk_notatoken")).status).toBe(401);
  });

  it("answers 403 JSON for a role outside the list, and runs the body for one inside", async () => {
    const refused = await post(JSON.stringify({ reason: "abc" }), tokens.observer);
    expect(refused.status).toBe(403);
    expect((await refused.json()).error).toMatch(/observer/);
    const ok = await post(JSON.stringify({ reason: "abc" }), tokens.shifter);
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ by: "shifter", reason: "abc" });
  });

  it("answers 400 for malformed JSON and 422 naming the field at fault", async () => {
    expect((await post("{not json", tokens.coordinator)).status).toBe(400);
    const res = await post(JSON.stringify({ reason: 5 }), tokens.coordinator);
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.issues[0].path).toBe("reason");
  });

  it("refuses a body naming a key twice (422 naming it), a lone surrogate (422) and bytes that are not UTF-8 (400)", async () => {
    const twice = await post('{"reason":"abc","reason":"xyz"}', tokens.shifter);
    expect(twice.status).toBe(422);
    expect((await twice.json()).issues).toEqual([{ path: "reason", message: expect.stringMatching(/twice/) }]);
    const lone = await post('{"reason":"ab\\ud800"}', tokens.shifter);
    expect(lone.status).toBe(422);
    expect((await lone.json()).issues[0].path).toBe("reason");
    const latin1 = await route(
      new NextRequest("http://localhost/api/v1/x", {
        method: "POST",
        body: new Uint8Array([0x7b, 0x22, 0x72, 0x65, 0x61, 0x73, 0x6f, 0x6e, 0x22, 0x3a, 0x22, 0xe9, 0xe9, 0xe9, 0x22, 0x7d]),
        headers: { "content-type": "application/json", authorization: `Bearer ${tokens.shifter}` },
      }),
    );
    expect(latin1.status).toBe(400);
    expect((await latin1.json()).error).toMatch(/UTF-8/);
  });

  it("refuses a revoked token", async () => {
    const user = await createTestUser("shifter");
    const { id, token } = await createApiToken(user.id, "short-lived");
    expect((await post(JSON.stringify({ reason: "abc" }), token)).status).toBe(200);
    expect(await revokeApiToken(user.id, id)).toBe(true);
    expect((await post(JSON.stringify({ reason: "abc" }), token)).status).toBe(401);
  });

  it("turns a thrown ApiError into its status and an unexpected error into a 500 with a request id", async () => {
    const throwing = handler({ roles: can.read }, async () => {
      throw new ApiError(409, "already claimed", { by: "someone" });
    });
    const req = () =>
      new NextRequest("http://localhost/x", { headers: { authorization: `Bearer ${tokens.observer}` } });
    const res = await throwing(req());
    expect(res.status).toBe(409);
    expect(await res.json()).toMatchObject({ error: "already claimed", by: "someone" });
    const crashing = handler({ roles: can.read }, async () => {
      throw new Error("boom");
    });
    const crash = await crashing(req());
    expect(crash.status).toBe(500);
    expect((await crash.json()).requestId).toMatch(/[0-9a-f-]{36}/);
  });
});
