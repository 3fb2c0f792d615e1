import { describe, expect, it } from "vitest";
import { candidateRevisions, candidates, followUpTasks } from "@/db/schema";
import { sourceClassIds, stageIds, taskKindIds, taskStateIds, triageStateIds } from "@/lib/triage/states";

describe("the ids browser code lists", () => {
  it("are the values the tables' columns accept, in order", () => {
    expect(candidates.triageState.enumValues).toEqual(triageStateIds);
    expect(candidates.stage.enumValues).toEqual(stageIds);
    expect(candidateRevisions.stage.enumValues).toEqual(stageIds);
    expect(candidates.dominantClass.enumValues).toEqual(sourceClassIds);
    expect(followUpTasks.kind.enumValues).toEqual(taskKindIds);
    expect(followUpTasks.state.enumValues).toEqual(taskStateIds);
  });
});
