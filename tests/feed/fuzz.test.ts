import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/v1/feed/candidates/route";
import { feedCandidateSchema } from "@/lib/validations/feed";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { feedRequest, rowCounts, samplePayload, setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

const valid = samplePayload({ spins: { chi1: 0.1, chi2: 0 } });
const validJson = JSON.parse(JSON.stringify(valid)) as Record<string, unknown>;
const requiredKeys = ["source", "externalId", "revision", "stage", "eventTime", "detectors", "networkSnr", "falseAlarmRatePerYear", "frequencyTrack", "masses"];
const numericPaths: string[][] = [["revision"], ["networkSnr"], ["falseAlarmRatePerYear"], ["masses", "m1", "mean"], ["masses", "m2", "sd"], ["spins", "chi1"]];

function setPath(target: Record<string, unknown>, path: string[], value: unknown): Record<string, unknown> {
  const copy = structuredClone(target);
  let node: Record<string, unknown> = copy;
  for (const key of path.slice(0, -1)) node = node[key] as Record<string, unknown>;
  node[path[path.length - 1] as string] = value;
  return copy;
}

/** Bodies that must be refused: random text, random JSON, and valid bodies with one certain defect. */
const malformedBody = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.jsonValue({ maxDepth: 3 }).map((value) => JSON.stringify(value) ?? "null"),
  fc.constantFrom(...requiredKeys).map((key) => {
    const copy = structuredClone(validJson);
    delete copy[key];
    return JSON.stringify(copy);
  }),
  fc
    .tuple(fc.constantFrom(...numericPaths), fc.oneof(fc.string(), fc.boolean(), fc.constant(null), fc.constant([]), fc.constant({})))
    .map(([path, value]) => JSON.stringify(setPath(validJson, path, value))),
  // Out of range or non-finite (1e999 parses to Infinity); the few that stay valid are skipped below.
  fc.tuple(fc.constantFrom(...numericPaths), fc.constantFrom("-1e999", "1e999", "-5", "1e7", "2.5"))
    .map(([path, text]) => JSON.stringify(setPath(validJson, path, "__NUMBER__")).replace('"__NUMBER__"', text)),
  fc.string({ minLength: 1, maxLength: 12 }).filter((key) => !(key in validJson)).map((key) => JSON.stringify({ ...validJson, [key]: 1 })),
  fc.array(fc.double({ noNaN: true, noDefaultInfinity: true }), { maxLength: 5 }).map((f) =>
    JSON.stringify({ ...validJson, frequencyTrack: { t: [0, 1, 2, 3, 4, 5, 6], f } }),
  ),
);

describe("fuzzing the feed route with malformed bodies", () => {
  it("never answers 2xx or 5xx, writes no candidate rows, and dead-letters exactly the signed refusals", { timeout: 120_000 }, async () => {
    const before = await rowCounts();
    let signedRefusals = 0;
    let runs = 0;
    await fc.assert(
      fc.asyncProperty(malformedBody, fc.integer({ min: 0, max: 9 }), async (raw, signingRoll) => {
        // The generators are built to be invalid; make sure none slipped through as a valid body.
        let parsed: unknown = undefined;
        try {
          parsed = JSON.parse(raw);
        } catch {
          // not JSON: certainly refused
        }
        fc.pre(!feedCandidateSchema.safeParse(parsed).success);
        runs += 1;
        const badlySigned = signingRoll === 0;
        const res = await POST(feedRequest(raw, badlySigned ? { secret: "not-the-feed-secret-at-all-0000000000" } : {}));
        if (badlySigned) {
          expect(res.status).toBe(401);
        } else {
          expect([400, 422]).toContain(res.status);
          signedRefusals += 1;
        }
        const body = await res.json();
        expect(typeof body.error).toBe("string");
      }),
      { numRuns: 1200, seed: 20261201 },
    );
    expect(runs).toBeGreaterThanOrEqual(1000);
    const after = await rowCounts();
    expect(after).toEqual({ ...before, deadLetters: before.deadLetters + signedRefusals });
  });
});
