import { describe, expect, it } from "vitest";
import { settingSchemas } from "@/lib/data/settings";
import { reviewCandidates } from "@/lib/review/evaluate";
import { buildHandoffSummary, handoffText } from "@/lib/review/handoff-summary";
import { stepDeadlinesMs } from "@/lib/review/steps";
import type { CandidateFacts } from "@/lib/review/timeline";

const T0 = Date.UTC(2026, 5, 1, 12, 0, 0);
const NOW = T0 + 3_600_000; // an hour after both were received: both far past the 4-min acknowledgement deadline
const deadlines = stepDeadlinesMs(settingSchemas.deadlines.parse({}));

const facts = (over: Partial<CandidateFacts>): CandidateFacts => ({
  id: "c1", source: "feed", externalId: "trg-a", stage: "preliminary", dominantClass: "bbh", triageState: "new",
  ownerId: null, eventTimeMs: T0 - 10_000, receivedAtMs: T0, withdrawnAtMs: null, firstPageAtMs: T0 + 5_000,
  acknowledgedAtMs: null, acknowledgedById: null, firstDecisionAtMs: null, firstDecision: null, decidedById: null,
  firstPursueAtMs: null, firstClaimAtMs: null, claimedById: null, firstReportAtMs: null, reportedById: null,
  taskCount: 0, cancelledTaskCount: 0, firstExposureAtMs: null, firstExposureById: null, covered50AtMs: null, covered90AtMs: null,
  hasSkymap: false, ...over,
});

describe("handoff summary and withdrawn candidates", () => {
  const rows = reviewCandidates(
    [
      facts({ id: "live", externalId: "trg-live" }),
      facts({ id: "gone", externalId: "trg-gone", stage: "withdrawn", withdrawnAtMs: T0 + 60_000 }),
    ],
    deadlines,
    NOW,
  );
  const summary = buildHandoffSummary({
    shift: { id: "s", startsAtMs: T0 - 3_600_000, endsAtMs: NOW, primaryName: "Ana Vell", backupName: null },
    builtAtMs: NOW,
    rows,
    deadlinesMs: deadlines,
    decisions: [],
    liveTasks: { total: 0, rows: [] },
  });

  it("lists a withdrawn candidate as withdrawn, not as still waiting in New", () => {
    expect(summary.received.items.map((c) => [c.externalId, c.triageState])).toEqual([["trg-live", "new"], ["trg-gone", "withdrawn"]]);
    expect(summary.awaitingDecision.items.map((c) => c.externalId)).toEqual(["trg-live"]);
    expect(handoffText(summary, "UTC", "http://x").body).toContain("trg-gone  withdrawn, bbh, now withdrawn");
  });

  it("counts only the live candidate's acknowledgement as missed", () => {
    expect(summary.missed.items.map((m) => [m.externalId, m.step, m.status])).toEqual([["trg-live", "acknowledge", "open"]]);
    expect(summary.missed.total).toBe(1);
  });
});
