import { describe, expect, it } from "vitest";
import { keysForEvent } from "@/components/live/query-keys";
import { eventKinds } from "@/lib/events/kinds";

const event = (kind: string, candidateId: string | null = "c1", taskId: string | null = null) => ({ kind, candidateId, taskId });

describe("which queries a live event refreshes", () => {
  it("a triage move refreshes the board, the list and that candidate", () => {
    expect(keysForEvent(event(eventKinds.candidateTriaged))).toEqual([["board"], ["candidates"], ["candidate", "c1"]]);
  });

  it("a withdrawal also refreshes the follow-up board (its tasks were cancelled)", () => {
    expect(keysForEvent(event(eventKinds.candidateWithdrawn))).toContainEqual(["tasks"]);
    expect(keysForEvent(event(eventKinds.candidateCreated))).not.toContainEqual(["tasks"]);
  });

  it("task events refresh both boards (cards count live tasks) and the candidate", () => {
    expect(keysForEvent(event(eventKinds.taskStateChanged, "c2", "t1"))).toEqual([["tasks"], ["board"], ["candidate", "c2"]]);
  });

  it("a note refreshes only that thread and candidate; rota changes only the roster; paging events nothing", () => {
    expect(keysForEvent(event(eventKinds.candidateNoteAdded))).toEqual([["notes", "c1"], ["candidate", "c1"]]);
    expect(keysForEvent(event(eventKinds.shiftChanged, null))).toEqual([["roster"]]);
    expect(keysForEvent(event(eventKinds.pageQueued))).toEqual([]);
  });

  it("a recorded observation refreshes that candidate's coverage and the task cards; a counterpart its list", () => {
    expect(keysForEvent(event(eventKinds.observationsRecorded, "c3", "t2"))).toEqual([["coverage", "c3"], ["observations", "c3"], ["tasks"], ["candidate", "c3"]]);
    expect(keysForEvent(event(eventKinds.counterpartReported, "c3"))).toEqual([["counterparts", "c3"], ["candidate", "c3"]]);
    expect(keysForEvent(event(eventKinds.observationsWithdrawn, "c3", "t2"))).toContainEqual(["coverage", "c3"]);
  });

  it("a new sky map recomputes coverage and counterpart ranks (both are read on the newest map)", () => {
    const keys = keysForEvent(event(eventKinds.skymapUploaded, "c4"));
    expect(keys).toContainEqual(["coverage", "c4"]);
    expect(keys).toContainEqual(["counterparts", "c4"]);
  });

  it("plan events refresh the follow-up board, that candidate's plans and the candidate", () => {
    expect(keysForEvent(event(eventKinds.pointingDone, "c3", "t2"))).toEqual([["tasks"], ["plans", "c3"], ["candidate", "c3"]]);
    expect(keysForEvent(event(eventKinds.planCreated, "c3"))).toEqual([["tasks"], ["plans", "c3"], ["candidate", "c3"]]);
  });
});
