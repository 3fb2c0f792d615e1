import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { loadCandidateFacts } from "@/lib/review/facts";
import { transitionCandidate } from "@/lib/services/move-card";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { setNotifyClock } from "@/lib/notify/clock";
import { candidateSteps } from "@/lib/review/timeline";
import { splitTrigger } from "@/lib/services/regroup-triggers";
import type { FeedCandidate } from "@/lib/validations/feed";
import { feedRequest, samplePayload, setTestEnvironment } from "../feed/support/feed-helpers";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";

let testDb: TestDatabase;
let clockMs = Date.UTC(2026, 11, 3, 2, 0, 0);
const route = feedIngest.with({ now: () => clockMs });

beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
  setNotifyClock(() => clockMs);
});
afterAll(async () => {
  setNotifyClock(null);
  await testDb.cleanup();
});

async function post(payload: FeedCandidate) {
  const res = await route(feedRequest(JSON.stringify(payload), { nowMs: clockMs }));
  return (await res.json()) as { id: string; triggerId: string; outcome: string };
}

describe("the review's step durations of a grouped candidate", () => {
  it("run from the first trigger's receipt, though a later trigger became preferred", async () => {
    const t0 = clockMs;
    const eventTime = new Date(t0 - 30_000).toISOString();
    const first = await post(samplePayload({ source: "pipe-a", eventTime, falseAlarmRatePerYear: 0.3 }));
    clockMs = t0 + 40_000;
    const later = await post(samplePayload({ source: "pipe-b", eventTime: new Date(t0 - 29_800).toISOString(), falseAlarmRatePerYear: 0.001 }));
    expect(later).toMatchObject({ outcome: "joined", id: first.id });
    const shifter = await createTestUser("shifter");
    await transitionCandidate({ actor: shifter, candidateId: first.id, to: "acknowledged", via: "board", now: new Date(t0 + 100_000) });

    const nowMs = t0 + 200_000;
    const facts = (await loadCandidateFacts({ fromMs: t0 - 3_600_000, toMs: t0 + 3_600_000 }, nowMs)).find((f) => f.id === first.id);
    expect(facts?.receivedAtMs).toBe(t0);
    const steps = candidateSteps(facts!, nowMs);
    // The preferred trigger's event time is 29.8 s before the first receipt.
    expect(steps.find((s) => s.step === "feed")).toMatchObject({ startMs: t0 - 29_800, endMs: t0, durationMs: 29_800 });
    // No page was sent (no worker ran): acknowledged 100 s after the first receipt, not 60 s after the second.
    expect(steps.find((s) => s.step === "acknowledge")).toMatchObject({ startMs: t0, durationMs: 100_000 });

    // Split out, the later trigger's own candidate runs from its own receipt.
    const coordinator = await createTestUser("coordinator");
    const split = await splitTrigger({ actor: coordinator, candidateId: first.id, triggerId: later.triggerId, now: new Date(t0 + 150_000) });
    const splitFacts = (await loadCandidateFacts({ fromMs: t0 - 3_600_000, toMs: t0 + 3_600_000 }, nowMs)).find((f) => f.id === split.toCandidateId);
    expect(splitFacts?.receivedAtMs).toBe(t0 + 40_000);
  });
});
