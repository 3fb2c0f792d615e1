import { eq } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/v1/feed/candidates/route";
import { getDb } from "@/db";
import { deadLetters } from "@/db/schema";
import { signFeedBody } from "@/lib/feed/signature";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment, testSecret } from "./support/feed-helpers";

let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  await createTestUser("shifter");
});
afterAll(() => testDb.cleanup());

async function deadLetter(id: string) {
  const db = await getDb();
  const [row] = await db.select().from(deadLetters).where(eq(deadLetters.id, id));
  return row;
}

describe("feed bodies are refused rather than silently changed", () => {
  it("refuses duplicate keys (422 naming the key) and keeps the post as a dead letter", async () => {
    const good = JSON.stringify(samplePayload({ externalId: "dup-keys-1", stage: "withdrawn" }));
    const raw = good.replace('"stage":"withdrawn"', '"stage":"withdrawn","stage":"first-look"');
    expect(raw).not.toBe(good);
    const before = await rowCounts();
    const res = await POST(feedRequest(raw));
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.issues).toEqual([{ path: "stage", message: expect.stringMatching(/twice/) }]);
    expect(await rowCounts()).toEqual({ ...before, deadLetters: before.deadLetters + 1 });
    expect(await deadLetter(body.deadLetterId)).toMatchObject({ statusCode: 422, rawBody: raw });
  });

  it("compares keys decoded and names a nested duplicate by its path", async () => {
    const raw = JSON.stringify(samplePayload({ externalId: "dup-keys-2" })).replace('"source":', '"\\u0073ource":"x","source":');
    const res = await POST(feedRequest(raw));
    expect(res.status).toBe(422);
    expect((await res.json()).issues[0].path).toBe("source");
  });

  it("refuses external ids with a lone surrogate (422), so they never collide with a literal U+FFFD", async () => {
    for (const escape of ["\\ud800", "\\udbff", "\\udc00"]) {
      const raw = JSON.stringify(samplePayload({ externalId: "sur-PLACE" })).replace("PLACE", escape);
      const res = await POST(feedRequest(raw));
      expect(res.status, escape).toBe(422);
      const body = await res.json();
      expect(body.issues[0]).toMatchObject({ path: "externalId", message: expect.stringMatching(/lone UTF-16 surrogate/) });
    }
    const replacement = await POST(feedRequest(JSON.stringify(samplePayload({ externalId: "sur-\ufffd" }))));
    expect(replacement.status).toBe(201);
    // A proper pair (an astral character) is valid Unicode and accepted.
    const astral = await POST(feedRequest(JSON.stringify(samplePayload({ externalId: "sur-\ud83d\ude00" }))));
    expect(astral.status).toBe(201);
  });

  it("verifies the signature over the raw bytes, then refuses a non-UTF-8 body (400) kept as a dead letter", async () => {
    const text = JSON.stringify(samplePayload({ externalId: "latin-X" }));
    const bytes = Buffer.concat([Buffer.from(text.slice(0, text.indexOf("X"))), Buffer.from([0xe9]), Buffer.from(text.slice(text.indexOf("X") + 1))]);
    const before = await rowCounts();
    const res = await POST(
      new NextRequest("http://localhost/api/v1/feed/candidates", {
        method: "POST",
        body: bytes,
        headers: { "content-type": "application/json", ...signFeedBody(testSecret, bytes, Date.now()) },
      }),
    );
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error).toMatch(/not valid UTF-8/);
    expect(await rowCounts()).toEqual({ ...before, deadLetters: before.deadLetters + 1 });
    const letter = await deadLetter(body.deadLetterId);
    expect(Buffer.from(letter?.rawBody ?? "", "base64").equals(bytes)).toBe(true);
  });
});
