import { NextRequest } from "next/server";
import { desc } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/v1/feed/candidates/route";
import { GET as getDeadLetters } from "@/app/api/v1/dead-letters/route";
import { getDb } from "@/db";
import { deadLetters } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

async function latestDeadLetter() {
  const db = await getDb();
  const [row] = await db.select().from(deadLetters).orderBy(desc(deadLetters.receivedAt)).limit(1);
  return row;
}

describe("refused feed posts", () => {
  it("answers 400 for malformed JSON and keeps the raw body as a dead letter", async () => {
    const raw = '{"source": "pipeline-test", "revision": 1,';
    const before = await rowCounts();
    const res = await POST(feedRequest(raw));
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error).toMatch(/not valid JSON/);
    const after = await rowCounts();
    expect(after).toEqual({ ...before, deadLetters: before.deadLetters + 1 });
    const letter = await latestDeadLetter();
    expect(letter).toMatchObject({ id: body.deadLetterId, statusCode: 400, rawBody: raw });
  });

  it("answers 422 naming every field path at fault", async () => {
    const payload = samplePayload();
    const broken = {
      ...payload,
      revision: 0,
      stage: "perhaps",
      detectors: ["n1"],
      masses: { m1: { mean: -1, sd: 0.1 }, m2: payload.masses.m2 },
      frequencyTrack: { t: payload.frequencyTrack.t, f: payload.frequencyTrack.f.slice(2) },
      colour: "blue",
    };
    const res = await POST(feedRequest(JSON.stringify(broken)));
    expect(res.status).toBe(422);
    const body = await res.json();
    const paths = (body.issues as Array<{ path: string }>).map((i) => i.path).sort();
    expect(paths).toEqual(["(body)", "detectors.0", "frequencyTrack.f", "masses.m1.mean", "revision", "stage"]);
    const letter = await latestDeadLetter();
    expect(letter?.statusCode).toBe(422);
    expect(letter?.issues?.map((i) => i.path).sort()).toEqual(paths);
    expect(letter?.source).toBe("pipeline-test");
    expect(letter?.externalId).toBe(payload.externalId);
  });

  it("answers 422 for a track of 200 001 samples, and accepts exactly 200 000", async () => {
    const long = (n: number) => {
      const t = Array.from({ length: n }, (_, i) => -200 + i * 0.0009);
      return samplePayload({ frequencyTrack: { t, f: t.map(() => 30) } });
    };
    const before = await rowCounts();
    const refused = await POST(feedRequest(JSON.stringify(long(200_001))));
    expect(refused.status).toBe(422);
    expect((await refused.json()).issues).toEqual([{ path: "frequencyTrack.t", message: "has 200001 samples; at most 200000" }]);
    expect((await rowCounts()).deadLetters).toBe(before.deadLetters + 1);
    // A flat track is not a chirp: the physics reports that as a reason, the post itself is fine.
    const accepted = await POST(feedRequest(JSON.stringify(long(200_000))));
    expect(accepted.status).toBe(201);
    const { derived } = await accepted.json();
    expect(derived.chirpMass).toBeNull();
    expect(typeof derived.chirpMassError).toBe("string");
  });

  it("answers 413 for a body over 5 MB without storing anything", async () => {
    const before = await rowCounts();
    const raw = `{"pad":"${"x".repeat(5 * 1024 * 1024)}"}`;
    const res = await POST(feedRequest(raw));
    expect(res.status).toBe(413);
    // Signature headers present (checked first), then the declared length: refused before the body is read.
    const declared = await POST(feedRequest("{}", { headers: { "content-length": String(6 * 1024 * 1024) } }));
    expect(declared.status).toBe(413);
    expect(await rowCounts()).toEqual(before);
  });

  it("shows dead letters to coordinators only", async () => {
    const coordinator = await createTestUser("coordinator");
    const shifter = await createTestUser("shifter");
    const read = async (userId: string) => {
      const { token } = await createApiToken(userId, "test");
      return getDeadLetters(new NextRequest("http://localhost/api/v1/dead-letters", { headers: { authorization: `Bearer ${token}` } }));
    };
    expect((await read(shifter.id)).status).toBe(403);
    const res = await read(coordinator.id);
    expect(res.status).toBe(200);
    const { deadLetters: letters } = await res.json();
    const statuses = letters.map((l: { statusCode: number }) => l.statusCode);
    expect([...statuses].sort()).toEqual([400, 422, 422]);
    const notJson = letters.find((l: { statusCode: number }) => l.statusCode === 400);
    expect(notJson.rawBodyPreview).toBe('{"source": "pipeline-test", "revision": 1,');
  });
});
