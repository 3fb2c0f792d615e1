import { createHash } from "node:crypto";
import NextAuth from "next-auth";
import { encode } from "next-auth/jwt";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PATCH as updateMe } from "@/app/api/v1/me/route";
import { PATCH as updateUserRoute } from "@/app/api/v1/users/[id]/route";
import { createApiToken } from "@/lib/auth/api-tokens";
import { buildAuthOptions } from "@/lib/auth/options";
import type { SessionUser } from "@/lib/auth/roles";
import { setTestEnvironment } from "../feed/support/feed-helpers";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
let admin: SessionUser;
let adminToken: string;
const cookieName = "next-auth.session-token";

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  admin = await createTestUser("admin");
  adminToken = (await createApiToken(admin.id, "t")).token;
});
afterAll(() => testDb.cleanup());

/** A session cookie as next-auth issues it at sign-in (the jwt callback's sign-in branch, then encode). */
async function signedInCookie(user: SessionUser): Promise<string> {
  const options = buildAuthOptions();
  const sessionVersion = 0; // a fresh person's stored version
  const token = await options.callbacks!.jwt!({
    token: { sub: user.id, name: user.name, email: user.email },
    user: { id: user.id, role: user.role, sessionVersion } as never,
    account: null,
  } as never);
  return encode({ token, secret: process.env.NEXTAUTH_SECRET! });
}

/** Calls next-auth's own handler (its API-route form, which takes plain objects) and returns what it sent. */
async function callNextAuth(action: string, method: string, cookies: Record<string, string>, body?: Record<string, string>) {
  let sent: unknown;
  const res = {
    status: () => res,
    setHeader: () => res,
    getHeader: () => undefined,
    end: () => undefined,
    send: (b: unknown) => void (sent = b),
    json: (b: unknown) => void (sent = b),
  };
  const req = { query: { nextauth: [action] }, method, cookies, headers: {}, body };
  await (NextAuth as unknown as (q: unknown, s: unknown, o: unknown) => Promise<void>)(req, res, buildAuthOptions());
  return sent;
}

/** What GET /api/auth/session answers for a cookie. */
async function sessionFor(cookie: string) {
  return (await callNextAuth("session", "GET", { [cookieName]: cookie })) as { user?: { id: string; role?: string } };
}

async function signOut(cookie: string) {
  const csrf = "a".repeat(64);
  const hash = createHash("sha256").update(`${csrf}${process.env.NEXTAUTH_SECRET}`).digest("hex");
  await callNextAuth("signout", "POST", { [cookieName]: cookie, "next-auth.csrf-token": `${csrf}|${hash}` }, { csrfToken: csrf });
}

const patch = (url: string, body: unknown, token: string) =>
  new NextRequest(url, { method: "PATCH", headers: { authorization: `Bearer ${token}`, "content-type": "application/json" }, body: JSON.stringify(body) });

describe("sessions end when they should", () => {
  it("a copied cookie stops working after sign-out", async () => {
    const user = await createTestUser("shifter");
    const cookie = await signedInCookie(user);
    expect((await sessionFor(cookie)).user?.id).toBe(user.id);
    const copy = cookie;
    await signOut(cookie);
    expect((await sessionFor(copy)).user).toBeUndefined();
  });

  it("an admin's password reset and disabling end the person's sessions", async () => {
    const user = await createTestUser("shifter");
    const cookie = await signedInCookie(user);
    const res = await updateUserRoute(patch("http://localhost/api/v1/users/x", { password: "a-new-long-password" }, adminToken), {
      params: Promise.resolve({ id: user.id }),
    });
    expect(res.status).toBe(200);
    expect((await sessionFor(cookie)).user).toBeUndefined();
  });

  it("a demotion ends the session, so /api/auth/session never reports the old role; a rename does not", async () => {
    const user = await createTestUser("coordinator");
    const cookie = await signedInCookie(user);
    const ctx = { params: Promise.resolve({ id: user.id }) };
    expect((await updateUserRoute(patch("http://localhost/api/v1/users/x", { name: "Renamed Person" }, adminToken), ctx)).status).toBe(200);
    expect(await sessionFor(cookie)).toMatchObject({ user: { id: user.id, role: "coordinator", name: "Renamed Person" } });
    expect((await updateUserRoute(patch("http://localhost/api/v1/users/x", { role: "observer" }, adminToken), ctx)).status).toBe(200);
    expect((await sessionFor(cookie)).user).toBeUndefined();
  });

  it("changing one's own password ends one's sessions; an empty profile change is a 422, not a 500", async () => {
    const user = await createTestUser("observer", { password: "pw-observer-long" });
    const cookie = await signedInCookie(user);
    const token = (await createApiToken(user.id, "t")).token;
    const empty = await updateMe(patch("http://localhost/api/v1/me", {}, token));
    expect(empty.status).toBe(422);
    expect((await empty.json()).error).toMatch(/nothing to change/);
    const changed = await updateMe(patch("http://localhost/api/v1/me", { currentPassword: "pw-observer-long", newPassword: "another-long-password" }, token));
    expect(changed.status).toBe(200);
    expect((await sessionFor(cookie)).user).toBeUndefined();
  });
});

describe("tokens", () => {
  it("cannot mint tokens", async () => {
    const { POST } = await import("@/app/api/v1/me/tokens/route");
    const user = await createTestUser("shifter");
    const token = (await createApiToken(user.id, "t")).token;
    const res = await POST(
      new NextRequest("http://localhost/api/v1/me/tokens", {
        method: "POST",
        headers: { authorization: `Bearer ${token}`, "content-type": "application/json" },
        body: JSON.stringify({ label: "child" }),
      }),
    );
    expect(res.status).toBe(403);
    expect((await res.json()).error).toMatch(/cannot make API tokens/);
  });
});
