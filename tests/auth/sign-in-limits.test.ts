import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { clientAddress, parseTrustedProxies } from "@/lib/auth/client-address";
import { recordFailedSignIn, signInLimits, signInRetryAfterSeconds } from "@/lib/auth/rate-limit";
import { readSignInEmail } from "@/lib/auth/sign-in-body";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
beforeAll(async () => {
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

const now = new Date("2026-12-01T03:00:00Z");

describe("sign-in limits per client address and per account, never global", () => {
  it("locks an account against the address that failed on it, not against an address that has not", async () => {
    for (let i = 0; i < signInLimits.perAccountAddress; i++) {
      expect(await signInRetryAfterSeconds("victim@example.test", "198.51.100.1", now)).toBe(0);
      await recordFailedSignIn("victim@example.test", "198.51.100.1", now);
    }
    expect(await signInRetryAfterSeconds("Victim@Example.test", "198.51.100.1", now)).toBe(signInLimits.windowMs / 1000);
    expect(await signInRetryAfterSeconds("victim@example.test", "198.51.100.2", now)).toBe(0);
    const later = new Date(now.getTime() + signInLimits.windowMs + 1000);
    expect(await signInRetryAfterSeconds("victim@example.test", "198.51.100.1", later)).toBe(0);
  });

  it("thirty failures on made-up accounts from one address stop that address only; admins elsewhere still sign in", async () => {
    for (let i = 0; i < signInLimits.perAddress; i++) await recordFailedSignIn(`nobody${i}@example.test`, "203.0.113.9", now);
    expect(await signInRetryAfterSeconds("admin@example.test", "203.0.113.9", now)).toBeGreaterThan(0);
    expect(await signInRetryAfterSeconds("admin@example.test", "203.0.113.10", now)).toBe(0);
    expect(await signInRetryAfterSeconds("other@example.test", "192.0.2.1", now)).toBe(0);
  });

  it("an account under attack from many addresses refuses each failing address but not a fresh one", async () => {
    for (let i = 0; i < signInLimits.perAccount; i++) await recordFailedSignIn("target@example.test", `10.1.0.${i}`, now);
    expect(await signInRetryAfterSeconds("target@example.test", "10.1.0.3", now)).toBeGreaterThan(0);
    expect(await signInRetryAfterSeconds("target@example.test", "10.2.0.1", now)).toBe(0);
  });
});

describe("the client address", () => {
  const none = parseTrustedProxies("");
  const proxies = parseTrustedProxies("10.0.0.0/8, ::1");
  const h = (peer: string | null, xff?: string) => {
    const headers = new Headers();
    if (peer !== null) headers.set("x-chirpdesk-peer", peer);
    if (xff) headers.set("x-forwarded-for", xff);
    return headers;
  };

  it("is the socket's peer when no proxy is trusted, whatever X-Forwarded-For claims", () => {
    expect(clientAddress(h("192.0.2.7", "198.51.100.99"), none, true)).toBe("192.0.2.7");
    expect(clientAddress(h("::ffff:192.0.2.7", "1.2.3.4, 5.6.7.8"), none, true)).toBe("192.0.2.7");
  });

  it("is the nearest untrusted hop when the peer is a trusted proxy", () => {
    expect(clientAddress(h("10.0.0.5", "6.6.6.6, 198.51.100.4"), proxies, true)).toBe("198.51.100.4");
    expect(clientAddress(h("::1", "198.51.100.4, 10.2.3.4"), proxies, true)).toBe("198.51.100.4");
    // a rotated header changes only the part left of the proxy's own entry, which is never read
    expect(clientAddress(h("10.0.0.5", "7.7.7.7, 198.51.100.4"), proxies, true)).toBe("198.51.100.4");
  });

  it("without the socket stamp, says so rather than trusting the header as a real address", () => {
    expect(clientAddress(h(null, "198.51.100.4"), none, false)).toBe("unknown:198.51.100.4");
    // a forged stamp from a client is ignored when the preload did not set it
    expect(clientAddress(h("192.0.2.1", "198.51.100.4"), none, false)).toBe("unknown:198.51.100.4");
  });

  it("refuses a malformed TRUSTED_PROXIES entry by name", () => {
    expect(() => parseTrustedProxies("10.0.0.1, proxy.internal")).toThrow(/proxy\.internal/);
  });
});

describe("the account of a credentials post", () => {
  const post = (type: string, body: string) =>
    new Request("http://localhost/api/auth/callback/credentials", { method: "POST", headers: { "content-type": type }, body });

  it("is read from JSON as well as from a form, as next-auth reads both", async () => {
    expect(await readSignInEmail(post("application/json", JSON.stringify({ email: "a@example.test", password: "x" })))).toBe("a@example.test");
    expect(await readSignInEmail(post("application/x-www-form-urlencoded", "email=b%40example.test&password=x"))).toBe("b@example.test");
    expect(await readSignInEmail(post("application/json", "{broken"))).toBe("");
  });
});
