import { ne } from "drizzle-orm";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getReview } from "@/app/api/v1/review/route";
import { GET as getList } from "@/app/api/v1/review/candidates/route";
import { GET as getCsv } from "@/app/api/v1/review/export/route";
import { GET as getHandoff } from "@/app/api/v1/review/handoff/[shiftId]/route";
import { GET as getDeadlines, PUT as putDeadlines } from "@/app/api/v1/settings/deadlines/route";
import { getDb } from "@/db";
import { events } from "@/db/schema";
import { createApiToken } from "@/lib/auth/api-tokens";
import { setReviewClock } from "@/lib/review/clock";
import type { StepList } from "@/lib/review/list";
import type { ReviewReport } from "@/lib/review/report";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { NOW, writeFixtureLog, type FixtureLog } from "./helpers/fixture-log";

let testDb: TestDatabase;
let log: FixtureLog;
const tokens: Record<string, string> = {};
// Test users' time zone is UTC; the fixture's T0 is Monday 2026-03-02 10:00 UTC.
const range = "from=2026-03-01&to=2026-03-03";
const defaults = {
  feedLatencyMinutes: 2,
  pageMinutes: 1,
  acknowledgeStepMinutes: 4,
  decisionMinutes: 30,
  claimMinutes: 60,
  reportMinutes: 720,
  acknowledgeWarnMinutes: 3,
  acknowledgeAlarmMinutes: 5,
  firstExposureMinutes: 120,
  covered50Minutes: 720,
  covered90Minutes: 2880,
};

beforeAll(async () => {
  testDb = await setupTestDatabase();
  log = await writeFixtureLog();
  for (const [role, user] of [
    ["shifter", log.shifter],
    ["observer", log.observer],
    ["coordinator", log.coordinator],
    ["admin", await createTestUser("admin")],
  ] as const) {
    tokens[role] = (await createApiToken(user.id, "review tests")).token;
  }
  setReviewClock(() => NOW);
});
afterAll(async () => {
  setReviewClock(null);
  await testDb.cleanup();
});

function request(path: string, role: string, init: { method?: string; body?: unknown } = {}) {
  return new NextRequest(`http://localhost${path}`, {
    method: init.method ?? "GET",
    headers: { authorization: `Bearer ${tokens[role]}`, "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
}
async function report(query: string, role = "observer"): Promise<ReviewReport> {
  const res = await getReview(request(`/api/v1/review?${query}`, role));
  expect(res.status).toBe(200);
  return (await res.json()) as ReviewReport;
}

describe("GET /api/v1/review", () => {
  it("gives each step's count, median, p90 (Hyndman & Fan type 7), maximum, late and open for the fixture", async () => {
    const r = await report(range);
    expect(r.candidates).toBe(5);
    // acknowledgement: 20 s, 300 s, 570 s → median 300 s; p90: h = 2·0.9 + 1 = 2.8 → 300 + 0.8·270 = 516 s
    expect(r.steps.acknowledge).toEqual({ count: 3, medianMs: 300_000, p90Ms: 516_000, maxMs: 570_000, overDeadline: 2, open: 0, oldestOpenMs: null });
    // paging: 5 s, 30 s done → median 17.5 s, p90 = 5 + 0.9·25 = 27.5 s; TX-C open for 3 h and late
    expect(r.steps.page).toEqual({ count: 2, medianMs: 17_500, p90Ms: 27_500, maxMs: 30_000, overDeadline: 1, open: 1, oldestOpenMs: 10_800_000 });
    // feed: −30, 10, 15, 20, 40 s → median 15 s; p90: h = 4.6 → 20 + 0.6·20 = 32 s
    expect(r.steps.feed).toMatchObject({ count: 5, medianMs: 15_000, p90Ms: 32_000, maxMs: 40_000, overDeadline: 0 });
    expect(r.steps.claim).toMatchObject({ count: 1, medianMs: 1_140_000, open: 1, oldestOpenMs: 3_600_000, overDeadline: 0 });
  });

  it("bins the distribution around the deadline and lists a pre-merger alert apart", async () => {
    const r = await report(range);
    // acknowledgement deadline 240 s: edges 0, 60, 120, 180, 240, 360, 480, 960 s
    const ack = Object.fromEntries(r.histograms.acknowledge.map((b) => [b.key, [b.count, b.late]]));
    expect(ack).toMatchObject({ b0: [1, false], b4: [1, true], b6: [1, true], open: [0, false] });
    expect(r.histograms.feed[0]).toMatchObject({ key: "before", count: 1 });
  });

  it("weekly trend: every week of the range, empty ones included", async () => {
    const r = await report(range);
    expect(r.trend.map((w) => [w.weekStart, w.candidates])).toEqual([
      ["2026-02-23T00:00:00.000Z", 0],
      ["2026-03-02T00:00:00.000Z", 5],
    ]);
  });

  it("per-shift and per-person rows", async () => {
    const r = await report(range);
    expect(r.shifts.map((s) => [s.primaryName, s.candidates])).toEqual([
      ["Shifter One", 3],
      ["Shifter Two", 2],
    ]);
    const one = r.people.find((p) => p.id === log.shifter.id);
    // Shifter One acknowledged TX-A (300 s) and TX-B (570 s): median 435 s
    expect(one?.steps.acknowledge).toMatchObject({ count: 2, medianMs: 435_000, overDeadline: 2 });
    expect(r.people.find((p) => p.id === log.observer.id)?.steps.claim).toMatchObject({ count: 1, medianMs: 1_140_000 });
  });

  it("filters by person, shift and class", async () => {
    expect((await report(`${range}&person=${log.shifter2.id}`)).candidates).toBe(1);
    expect((await report(`${range}&shift=${log.shiftIds[0]}`)).candidates).toBe(3);
    expect((await report(`${range}&class=bbh`)).candidates).toBe(1);
    expect((await report(`${range}&stage=early-warning`)).steps.page.open).toBe(1);
  });

  it("gives an empty range zeros and nulls, never an error", async () => {
    const r = await report("from=2030-01-01&to=2030-01-07");
    expect(r.candidates).toBe(0);
    expect(r.steps.acknowledge).toEqual({ count: 0, medianMs: null, p90Ms: null, maxMs: null, overDeadline: 0, open: 0, oldestOpenMs: null });
    expect(r.histograms.page.length).toBeGreaterThan(0);
    expect(r.histograms.page.every((b) => b.count === 0)).toBe(true);
  });

  it("answers 422 for an inverted range and 404 for an unknown shift", async () => {
    expect((await getReview(request("/api/v1/review?from=2026-03-05&to=2026-03-01", "shifter"))).status).toBe(422);
    expect((await getReview(request("/api/v1/review?from=yesterday", "shifter"))).status).toBe(422);
    expect((await getReview(request(`/api/v1/review?${range}&shift=nope`, "shifter"))).status).toBe(404);
  });
});

describe("GET /api/v1/review/candidates (the candidates behind a bar)", () => {
  it("lists the late acknowledgements slowest first, and one bin", async () => {
    const res = await getList(request(`/api/v1/review/candidates?${range}&step=acknowledge&late=1`, "shifter"));
    const list = (await res.json()) as StepList;
    expect(list.rows.map((r) => [r.externalId, r.durationMs])).toEqual([["TX-B", 570_000], ["TX-A", 300_000]]);
    expect(list.rows[0]?.actorName).toBe("Shifter One");
    const bin = (await (await getList(request(`/api/v1/review/candidates?${range}&step=acknowledge&bin=b0`, "shifter"))).json()) as StepList;
    expect(bin.rows.map((r) => r.externalId)).toEqual(["TX-D"]);
  });

  it("refuses an unknown step with 422", async () => {
    expect((await getList(request(`/api/v1/review/candidates?${range}&step=coffee`, "shifter"))).status).toBe(422);
  });
});

describe("GET /api/v1/review/export", () => {
  it("sends the per-candidate table as CSV with CRLF lines", async () => {
    const res = await getCsv(request(`/api/v1/review/export?${range}`, "observer"));
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toMatch(/attachment; filename="chirpdesk-review-2026-03-01-to-2026-03-03\.csv"/);
    const lines = (await res.text()).split("\r\n");
    expect(lines[0]).toMatch(/^candidate_id,source,external_id,stage,class,triage_state,merger_utc,received_utc,feed_status,feed_seconds/);
    expect(lines).toHaveLength(7); // header, five candidates, and the empty string after the last CRLF
    const a = lines.find((l) => l.includes(",TX-A,"));
    expect(a).toContain(",done,300,true,"); // acknowledgement: status, seconds, over deadline
    expect(a).toContain("2026-03-02T10:00:00.000Z");
  });
});

describe("deadlines: everyone reads, only coordinators and admins change them", () => {
  it("refuses shifters and observers with 403", async () => {
    for (const role of ["shifter", "observer"]) {
      const res = await putDeadlines(request("/api/v1/settings/deadlines", role, { method: "PUT", body: defaults }));
      expect(res.status).toBe(403);
    }
    expect((await getDeadlines(request("/api/v1/settings/deadlines", "observer"))).status).toBe(200);
  });

  it("checks every field and the warning/alarm order (422 naming the field)", async () => {
    const missing = await putDeadlines(request("/api/v1/settings/deadlines", "coordinator", { method: "PUT", body: { pageMinutes: 1 } }));
    expect(missing.status).toBe(422);
    const order = await putDeadlines(
      request("/api/v1/settings/deadlines", "coordinator", { method: "PUT", body: { ...defaults, acknowledgeWarnMinutes: 9 } }),
    );
    expect(order.status).toBe(422);
    expect(((await order.json()) as { issues: Array<{ path: string }> }).issues[0]?.path).toBe("acknowledgeWarnMinutes");
  });

  it("re-evaluates the figures on the next read without touching stored events", async () => {
    const db = await getDb();
    const before = await db.select().from(events).where(ne(events.kind, "settings.changed"));
    // 5 min: TX-A's 300 s is now exactly at the deadline (not over); TX-B's 570 s still over
    const res = await putDeadlines(
      request("/api/v1/settings/deadlines", "coordinator", { method: "PUT", body: { ...defaults, acknowledgeStepMinutes: 5 } }),
    );
    expect(res.status).toBe(200);
    expect((await report(range)).steps.acknowledge.overDeadline).toBe(1);
    const admin = await putDeadlines(
      request("/api/v1/settings/deadlines", "admin", { method: "PUT", body: { ...defaults, acknowledgeStepMinutes: 10 } }),
    );
    expect(admin.status).toBe(200);
    expect((await report(range)).steps.acknowledge.overDeadline).toBe(0);
    expect(await db.select().from(events).where(ne(events.kind, "settings.changed"))).toEqual(before);
    await putDeadlines(request("/api/v1/settings/deadlines", "coordinator", { method: "PUT", body: defaults }));
  });
});

describe("GET /api/v1/review/handoff/:shiftId", () => {
  it("summarises the first shift: three received, two decisions, deadlines missed", async () => {
    const res = await getHandoff(request(`/api/v1/review/handoff/${log.shiftIds[0]}`, "shifter"), {
      params: Promise.resolve({ shiftId: log.shiftIds[0] }),
    });
    expect(res.status).toBe(200);
    const s = (await res.json()) as { received: { total: number }; decisions: { total: number; byState: Record<string, number> }; missed: { total: number; byStep: Record<string, number> }; awaitingDecision: { total: number }; openTasks: { total: number } };
    expect(s.received.total).toBe(3);
    expect(s.decisions).toMatchObject({ total: 2, byState: { pursue: 1, dismissed: 1 } });
    // TX-A and TX-B acknowledged late; TX-C's paging open and late
    expect(s.missed.byStep).toMatchObject({ acknowledge: 2, page: 1 });
    expect(s.awaitingDecision.total).toBe(1); // TX-C
    expect(s.openTasks.total).toBe(1); // TX-A's ALD task, claimed
  });

  it("answers 404 for an unknown shift", async () => {
    const res = await getHandoff(request("/api/v1/review/handoff/nope", "shifter"), { params: Promise.resolve({ shiftId: "nope" }) });
    expect(res.status).toBe(404);
  });
});
