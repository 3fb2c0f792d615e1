import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadCandidateFacts } from "@/lib/review/facts";
import { reviewCandidates, type CandidateReview } from "@/lib/review/evaluate";
import { stepDeadlinesMs } from "@/lib/review/steps";
import { settingSchemas } from "@/lib/data/settings";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { NOW, T0, writeFixtureLog, type FixtureLog } from "./helpers/fixture-log";

let testDb: TestDatabase;
let log: FixtureLog;
const day = 86_400_000;
// Default deadlines: feed 2 min, page 1 min, acknowledgement 4 min, decision 30 min, claim 60 min, report 12 h.
const deadlines = stepDeadlinesMs(settingSchemas.deadlines.parse({}));

beforeAll(async () => {
  testDb = await setupTestDatabase();
  log = await writeFixtureLog();
});
afterAll(() => testDb.cleanup());

async function review(extra: { siteId?: string } = {}): Promise<Map<string, CandidateReview>> {
  const facts = await loadCandidateFacts({ fromMs: T0 - day, toMs: T0 + day, ...extra }, NOW);
  return new Map(reviewCandidates(facts, deadlines, NOW).map((r) => [r.facts.externalId, r]));
}

// The response chain's six steps; the observing steps (merger → first exposure, → 50 %, → 90 %) need an
// observation log and are checked in tests/observations/review-steps.test.ts.
const chain = ["feed", "page", "acknowledge", "decide", "claim", "report"] as const;
const brief = (r: CandidateReview | undefined) =>
  r && Object.fromEntries(chain.map((k) => [k, [r.steps[k].status, r.steps[k].durationMs === null ? null : r.steps[k].durationMs / 1000, r.steps[k].overDeadline]]));

describe("step durations from the fixture audit log (worked by hand in fixture-log.ts times)", () => {
  it("keeps to the range: TX-F, two days earlier, is left out", async () => {
    expect([...(await review()).keys()].sort()).toEqual(["TX-A", "TX-B", "TX-C", "TX-D", "TX-E"]);
  });

  it("TX-A: every step done; the released claim still counts as the first claim", async () => {
    const a = (await review()).get("TX-A");
    expect(brief(a)).toEqual({
      feed: ["done", 20, false], // merger −20 s → receipt 0
      page: ["done", 5, false], // receipt → push sent at +5 s (the in-app row at +1 s is no page)
      acknowledge: ["done", 300, true], // page +5 s → acknowledged +305 s from receipt; past the 1 + 4 min deadline
      decide: ["done", 355, false], // +305 s → pursue at +660 s
      claim: ["done", 1140, false], // pursue +660 s → first claim at +30 min (1800 s), released and re-claimed later
      report: ["done", 9000, false], // first claim +1800 s → first report at +3 h (10 800 s)
    });
    expect(a?.steps.claim.actorId).toBe(log.observer.id);
    expect(a?.steps.report.actorId).toBe(log.observer2.id);
    expect(a?.steps.acknowledge.actorId).toBe(log.shifter.id);
  });

  it("TX-B: a failed push does not count; dismissed from new is acknowledgement and decision at once", async () => {
    expect(brief((await review()).get("TX-B"))).toEqual({
      feed: ["done", 40, false],
      page: ["done", 30, false], // the e-mail at +30 s; the push failed
      acknowledge: ["done", 570, true], // +30 s → +600 s
      decide: ["done", 0, false],
      claim: ["skipped", null, false],
      report: ["skipped", null, false],
    });
  });

  it("TX-C: a pre-merger alert has a negative feed latency; nothing paged yet, so paging is open with its age", async () => {
    expect(brief((await review()).get("TX-C"))).toEqual({
      feed: ["done", -30, false],
      page: ["open", 10_800, true], // received at +120 min, now is +300 min
      acknowledge: ["waiting", null, false],
      decide: ["waiting", null, false],
      claim: ["waiting", null, false],
      report: ["waiting", null, false],
    });
  });

  it("TX-D: acknowledged before the page went out; the first decision (expert) counts; claim open exactly at its deadline", async () => {
    const d = (await review()).get("TX-D");
    expect(brief(d)).toEqual({
      feed: ["done", 10, false],
      page: ["skipped", null, false],
      acknowledge: ["done", 20, false], // from receipt, as no page preceded it
      decide: ["done", 280, false], // +20 s → expert at +5 min
      claim: ["open", 3600, false], // pursue at +240 min, now +300 min: 60 min is not over a 60 min deadline
      report: ["waiting", null, false],
    });
    expect(d?.steps.page.note).toMatch(/before any page/);
  });

  it("TX-E: a withdrawn candidate leaves no step open", async () => {
    const e = (await review()).get("TX-E");
    expect(brief(e)).toMatchObject({ feed: ["done", 15, false], page: ["skipped", null, false], acknowledge: ["skipped", null, false] });
    expect(e?.steps.page.note).toBe("withdrawn");
  });

  it("a site filter keeps candidates with a task there and counts only that site's claims and reports", async () => {
    const atKrn = await review({ siteId: log.siteIds[1] });
    expect([...atKrn.keys()]).toEqual(["TX-A"]);
    // KRN's task: claimed at +40 min (2400 s − 660 s = 1740 s), reported at +180 min (8400 s after the claim)
    expect(brief(atKrn.get("TX-A"))).toMatchObject({ claim: ["done", 1740, false], report: ["done", 8400, false] });
    const atAld = (await review({ siteId: log.siteIds[0] })).get("TX-A");
    // ALD's task: claimed at +30 min, never reported: open for 300 − 30 = 270 min
    expect(brief(atAld)).toMatchObject({ claim: ["done", 1140, false], report: ["open", 16_200, false] });
  });

  it("reads as of `now`: before TX-A's acknowledgement the step is open and nothing later exists", async () => {
    const early = T0 + 200_000; // +200 s
    const facts = await loadCandidateFacts({ fromMs: T0 - day, toMs: T0 + day }, early);
    const [a] = reviewCandidates(facts, deadlines, early);
    expect(facts.map((f) => f.externalId)).toEqual(["TX-A"]);
    expect(brief(a)).toMatchObject({ page: ["done", 5, false], acknowledge: ["open", 195, false], decide: ["waiting", null, false] });
  });

  it("an empty range gives no candidates and no error", async () => {
    expect(await loadCandidateFacts({ fromMs: T0 + 10 * day, toMs: T0 + 11 * day }, NOW)).toEqual([]);
  });
});
