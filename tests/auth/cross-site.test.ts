import { NextRequest } from "next/server";
import { describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { handler } from "@/lib/api/handler";
import { can, type SessionUser } from "@/lib/auth/roles";

// The session lookup needs next-auth's request scope; here a cookie named "good" stands for a signed-in shifter,
// and a bearer token "cdk_good" for the same person, so the test is about the origin rules alone.
const shifter: SessionUser = { id: "u1", email: "s@example.test", name: "S", role: "shifter", timeZone: "UTC", initials: "S" };
vi.mock("@/lib/auth/session", () => ({
  resolveRequestUser: async (headers: Headers) => {
    if (headers.get("authorization")) return headers.get("authorization") === "Bearer cdk_good" ? shifter : null;
    return /next-auth\.session-token=good/.test(headers.get("cookie") ?? "") ? shifter : null;
  },
}));

const dismiss = handler({ roles: can.triage, body: z.object({ to: z.string() }) }, async ({ user, body }) => ({ by: user.id, to: body.to }));
const list = handler({ roles: can.read }, async () => ({ ok: true }));

const appOrigin = "http://localhost:3120";
function request(init: { method?: string; headers?: Record<string, string>; body?: string }) {
  return new NextRequest(`${appOrigin}/api/v1/candidates/x/triage`, { method: init.method ?? "POST", headers: init.headers, body: init.body });
}
const cookie = { cookie: "next-auth.session-token=good" };
const json = { "content-type": "application/json" };
const body = JSON.stringify({ to: "dismissed" });

describe("cookie-authenticated writes from another origin", () => {
  it("refuses a write whose Origin is another port of the same host, naming the reason", async () => {
    const res = await dismiss(request({ headers: { ...cookie, ...json, origin: "http://localhost:8081" }, body }));
    expect(res.status).toBe(403);
    const answer = await res.json();
    expect(answer).toMatchObject({ reason: "cross-site" });
    expect(answer.error).toMatch(/Origin http:\/\/localhost:8081/);
    expect(answer.requestId).toMatch(/[0-9a-f-]{36}/);
  });

  it("refuses a write the browser marks same-site or cross-site, whatever the Origin says", async () => {
    for (const site of ["same-site", "cross-site", "none"]) {
      const res = await dismiss(request({ headers: { ...cookie, ...json, origin: appOrigin, "sec-fetch-site": site }, body }));
      expect(res.status, site).toBe(403);
      expect((await res.json()).error).toMatch(new RegExp(`Sec-Fetch-Site is ${site}`));
    }
  });

  it("refuses an Origin of null (a sandboxed frame or a privacy redirect)", async () => {
    expect((await dismiss(request({ headers: { ...cookie, ...json, origin: "null" }, body }))).status).toBe(403);
  });

  it("accepts the app's own origin, by Origin or by Sec-Fetch-Site", async () => {
    const byOrigin = await dismiss(request({ headers: { ...cookie, ...json, origin: appOrigin }, body }));
    expect(byOrigin.status).toBe(200);
    expect(await byOrigin.json()).toEqual({ by: "u1", to: "dismissed" });
    const bySite = await dismiss(request({ headers: { ...cookie, ...json, "sec-fetch-site": "same-origin" }, body }));
    expect(bySite.status).toBe(200);
  });

  it("leaves reads alone: a cross-site GET is answered", async () => {
    const res = await list(new NextRequest(`${appOrigin}/api/v1/candidates`, { headers: { ...cookie, origin: "http://evil.test", "sec-fetch-site": "cross-site" } }));
    expect(res.status).toBe(200);
  });

  it("leaves bearer-token calls alone, even with a foreign Origin and no JSON type", async () => {
    const res = await dismiss(request({ headers: { ...cookie, authorization: "Bearer cdk_good", origin: "http://evil.test", "content-type": "text/plain" }, body }));
    expect(res.status).toBe(200);
  });
});

describe("cookie-authenticated bodies that are not JSON", () => {
  it("answers 415 for a text/plain or form body where JSON is expected, from our own origin too", async () => {
    for (const type of ["text/plain", "application/x-www-form-urlencoded", "multipart/form-data; boundary=x"]) {
      const res = await dismiss(request({ headers: { ...cookie, origin: appOrigin, "content-type": type }, body }));
      expect(res.status, type).toBe(415);
      expect((await res.json()).error).toMatch(/application\/json/);
    }
  });

  it("answers 415 for a string body sent without choosing a type (fetch then declares text/plain), and accepts application/json with a charset", async () => {
    expect((await dismiss(request({ headers: { ...cookie, origin: appOrigin }, body }))).status).toBe(415);
    const ok = await dismiss(request({ headers: { ...cookie, origin: appOrigin, "content-type": "application/json; charset=utf-8" }, body }));
    expect(ok.status).toBe(200);
  });
});
