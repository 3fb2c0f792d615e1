import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listRoute } from "@/app/api/v1/candidates/route";
import { listCandidates, type CandidateListPage } from "@/lib/data/candidates";
import { ingestCandidate } from "@/lib/services/ingest-trigger";
import { candidateListQuerySchema, parseCandidateListParams } from "@/lib/validations/candidates";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, type Caller } from "./helpers/api";

describe("the candidate page's address, one parameter at a time", () => {
  it("keeps the search and the good parameters when one is bad, and names the bad one", () => {
    const { query, ignored } = parseCandidateListParams({ q: "tb-", page: "zero", sort: "networkSnr", dir: "sideways" });
    expect(query.q).toBe("tb-");
    expect(query.sort).toBe("networkSnr");
    expect(query.page).toBe(1);
    expect(query.dir).toBe("desc");
    expect(ignored.map((i) => i.param)).toEqual(["dir", "page"]);
    expect(ignored.find((i) => i.param === "page")?.message).toBe("page must be a whole number from 1");
  });

  it("keeps a filter's known values and names the unknown ones; unknown parameters pass silently", () => {
    const { query, ignored } = parseCandidateListParams({ state: "new,bogus,reviewing", class: "bns", utm: "x" });
    expect(query.state).toEqual(["new", "reviewing"]);
    expect(query.class).toEqual(["bns"]);
    expect(ignored).toHaveLength(1);
    expect(ignored[0]?.param).toBe("state");
    expect(ignored[0]?.message).toMatch(/^state has no value “bogus” \(known: new, /);
  });

  it("gives the defaults for an empty address, with nothing ignored", () => {
    expect(parseCandidateListParams({})).toEqual({ query: candidateListQuerySchema.parse({}), ignored: [] });
  });
});

describe("paging past the end", () => {
  let testDb: TestDatabase;
  let shifter: Caller;

  beforeAll(async () => {
    testDb = await setupTestDatabase();
    shifter = await createCaller("shifter", "Pia Pager");
    const base = Date.UTC(2030, 4, 1, 12, 0, 0);
    // Seven fictional candidates a minute apart (outside the grouping window of each other).
    for (let i = 0; i < 7; i++) {
      const at = new Date(base + i * 60_000);
      await ingestCandidate(candidatePayload({ externalId: `PG-${i}`, eventTime: at }), at);
    }
  });
  afterAll(() => testDb.cleanup());

  it("answers the last page, numbered as such, for a page number past it", async () => {
    // 7 rows at 5 a page: pages 1 and 2, the second holding the two oldest
    const query = { ...candidateListQuerySchema.parse({ pageSize: "5", q: "PG-" }), page: 999 };
    const page = await listCandidates(query);
    expect(page.total).toBe(7);
    expect(page.page).toBe(2);
    expect(page.rows.map((r) => r.externalId)).toEqual(["PG-1", "PG-0"]);
    expect((await listCandidates({ ...query, page: 2 })).rows.map((r) => r.externalId)).toEqual(["PG-1", "PG-0"]);
  });

  it("answers page 1 of an empty result, and the API does the same", async () => {
    const empty = await listCandidates({ ...candidateListQuerySchema.parse({ q: "no-such" }), page: 4 });
    expect(empty).toMatchObject({ total: 0, page: 1, rows: [] });
    const res = await callRoute(listRoute, { caller: shifter, url: "http://localhost/api/v1/candidates?q=PG-&pageSize=5&page=999" });
    expect(res.status).toBe(200);
    expect((res.json as unknown as CandidateListPage).page).toBe(2);
  });

  it("keeps the API strict: a bad parameter is a 422 naming it", async () => {
    const res = await callRoute(listRoute, { caller: shifter, url: "http://localhost/api/v1/candidates?q=PG-&page=zero" });
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.json)).toContain("page");
  });
});
