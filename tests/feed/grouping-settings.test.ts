import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET, PUT } from "@/app/api/v1/settings/grouping/route";
import { createApiToken } from "@/lib/auth/api-tokens";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import type { FeedCandidate } from "@/lib/validations/feed";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, samplePayload, setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
const clockMs = Date.UTC(2026, 11, 1, 4, 13, 0);
const route = feedIngest.with({ now: () => clockMs });
const tokens = { coordinator: "", shifter: "" };

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  tokens.coordinator = (await createApiToken((await createTestUser("coordinator")).id, "t")).token;
  tokens.shifter = (await createApiToken((await createTestUser("shifter")).id, "t")).token;
});
afterAll(() => testDb.cleanup());

async function put(body: unknown, as: keyof typeof tokens) {
  const req = new NextRequest("http://localhost/api/v1/settings/grouping", {
    method: "PUT",
    headers: { authorization: `Bearer ${tokens[as]}`, "content-type": "application/json" },
    body: JSON.stringify(body),
  });
  const res = await PUT(req, { params: Promise.resolve({}) });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

async function post(payload: FeedCandidate) {
  return (await (await route(feedRequest(JSON.stringify(payload), { nowMs: clockMs }))).json()) as { id: string; outcome: string };
}

describe("the grouping setting", () => {
  it("is read by everyone, changed by coordinators only, refused with the field named, and used by the next ingest", async () => {
    const read = await GET(new NextRequest("http://localhost/api/v1/settings/grouping", { headers: { authorization: `Bearer ${tokens.shifter}` } }), {
      params: Promise.resolve({}),
    });
    expect(await read.json()).toEqual({ coincidenceWindowMs: 1000, preferredBy: "lowest-far" });
    expect((await put({ coincidenceWindowMs: 2000, preferredBy: "lowest-far" }, "shifter")).status).toBe(403);
    const bad = await put({ coincidenceWindowMs: 20_000, preferredBy: "lowest-far" }, "coordinator");
    expect(bad.status).toBe(422);
    expect(JSON.stringify(bad.body.issues)).toContain("coincidenceWindowMs");

    const base = Date.UTC(2026, 11, 1, 7, 0, 0);
    const a = await post(samplePayload({ source: "pipe-a", eventTime: new Date(base).toISOString() }));
    const far = await post(samplePayload({ source: "pipe-b", eventTime: new Date(base + 1_500).toISOString() }));
    expect(far.outcome).toBe("created");
    expect((await put({ coincidenceWindowMs: 2000, preferredBy: "highest-snr" }, "coordinator")).status).toBe(200);
    const joined = await post(samplePayload({ source: "pipe-c", eventTime: new Date(base - 1_900).toISOString() }));
    expect(joined).toMatchObject({ outcome: "joined", id: a.id });
  });
});
