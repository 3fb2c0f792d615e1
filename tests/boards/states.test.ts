import { describe, expect, it } from "vitest";
import { sourceClasses, stages, taskKinds, taskStates, triageStates } from "@/db/schema";
import { sourceClassIds, stageIds, taskKindIds, taskStateIds, triageStateIds } from "@/lib/triage/states";

describe("browser-side copies of the schema's ids", () => {
  it("match the tables' enums exactly, in order", () => {
    expect(triageStateIds).toEqual(triageStates);
    expect(stageIds).toEqual(stages);
    expect(sourceClassIds).toEqual(sourceClasses);
    expect(taskKindIds).toEqual(taskKinds);
    expect(taskStateIds).toEqual(taskStates);
  });
});
