import { createHmac } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/v1/feed/candidates/route";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { computeFeedSignature, signFeedBody, verifyFeedSignature } from "@/lib/feed/signature";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment, testSecret } from "./support/feed-helpers";

const nowMs = Date.UTC(2026, 11, 1, 4, 15, 0);
const body = '{"hello":"feed"}';

function headersOf(record: Record<string, string>): Headers {
  return new Headers(record);
}

describe("verifyFeedSignature (HMAC-SHA256 over \"<timestamp>.<body>\", RFC 2104)", () => {
  it("computes the digest independently of the helper", () => {
    const expected = createHmac("sha256", testSecret).update(`1700000000.${body}`).digest("hex");
    expect(computeFeedSignature(testSecret, 1700000000, body)).toBe(expected);
  });

  it("accepts a good signature made now, and one 4 minutes old", () => {
    expect(verifyFeedSignature(testSecret, headersOf(signFeedBody(testSecret, body, nowMs)), body, nowMs)).toEqual({ ok: true });
    const older = signFeedBody(testSecret, body, nowMs - 4 * 60_000);
    expect(verifyFeedSignature(testSecret, headersOf(older), body, nowMs).ok).toBe(true);
  });

  it("refuses a signature made with another secret, or over another body", () => {
    const wrongSecret = signFeedBody(`${testSecret}x`, body, nowMs);
    expect(verifyFeedSignature(testSecret, headersOf(wrongSecret), body, nowMs)).toEqual({ ok: false, reason: "signature does not match" });
    const good = signFeedBody(testSecret, body, nowMs);
    expect(verifyFeedSignature(testSecret, headersOf(good), `${body} `, nowMs).ok).toBe(false);
  });

  it("refuses a stale timestamp (over 5 minutes either way) even with a valid digest", () => {
    for (const offsetMs of [-5 * 60_000 - 1000, 5 * 60_000 + 1000]) {
      const headers = signFeedBody(testSecret, body, nowMs + offsetMs);
      const check = verifyFeedSignature(testSecret, headersOf(headers), body, nowMs);
      expect(check.ok).toBe(false);
      expect(check.ok ? "" : check.reason).toMatch(/300 s/);
    }
  });

  it("refuses missing or malformed headers", () => {
    const good = signFeedBody(testSecret, body, nowMs);
    const cases: Record<string, string>[] = [
      {},
      { "X-Feed-Timestamp": good["X-Feed-Timestamp"] ?? "" },
      { "X-Feed-Signature": good["X-Feed-Signature"] ?? "" },
      { ...good, "X-Feed-Timestamp": "yesterday" },
      { ...good, "X-Feed-Signature": (good["X-Feed-Signature"] ?? "").replace("sha256=", "") },
      { ...good, "X-Feed-Signature": `${good["X-Feed-Signature"]}00` },
    ];
    for (const headers of cases) expect(verifyFeedSignature(testSecret, headersOf(headers), body, nowMs).ok).toBe(false);
  });
});

describe("the feed route's signature check", () => {
  let testDb: TestDatabase;
  beforeAll(async () => {
    setTestEnvironment();
    testDb = await setupTestDatabase();
  });
  afterAll(() => testDb.cleanup());

  it("answers 401 JSON for missing, bad and stale signatures and stores nothing, not even a dead letter", async () => {
    const raw = JSON.stringify(samplePayload());
    const before = await rowCounts();
    const route = feedIngest.with({ now: () => nowMs });
    const attempts = [
      feedRequest(raw, { unsigned: true }),
      feedRequest(raw, { nowMs, secret: "another-secret-that-is-long-enough-000" }),
      feedRequest(raw, { nowMs: nowMs - 6 * 60_000 }),
    ];
    for (const request of attempts) {
      const res = await route(request);
      expect(res.status).toBe(401);
      expect((await res.json()).error).toMatch(/signature/);
    }
    expect(await rowCounts()).toEqual(before);
  });

  it("accepts the same body correctly signed (exported POST, signed at the moment of sending)", async () => {
    const res = await POST(feedRequest(JSON.stringify(samplePayload())));
    expect(res.status).toBe(201);
  });
});
