import { describe, expect, it } from "vitest";
import { instrumentCreateSchema, instrumentFormSchema } from "@/lib/validations/instruments";

/** What a person types into the sites page's instrument form: strings throughout. */
const typed = { name: "Wide camera", shape: "rectangle", widthDeg: "2", heightDeg: "1.5", radiusDeg: "", filters: " g, r ,, i ", exposureS: "90", overheadS: "20", limitingMag: "" };

function firstIssue(values: Record<string, unknown>): [string, string] {
  const parsed = instrumentFormSchema.safeParse(values);
  if (parsed.success) throw new Error(`accepted ${JSON.stringify(values)}`);
  const issue = parsed.error.issues[0]!;
  return [issue.path.join("."), issue.message];
}

describe("instrument form schema", () => {
  it("turns typed strings into the API's create body, which the route's schema accepts unchanged", () => {
    const out = instrumentFormSchema.parse(typed);
    expect(out).toEqual({ name: "Wide camera", footprint: { shape: "rectangle", widthDeg: 2, heightDeg: 1.5 }, filters: ["g", "r", "i"], exposureS: 90, overheadS: 20, limitingMag: null });
    expect(instrumentCreateSchema.parse(out)).toEqual(out);
  });

  it("a circle keeps only its radius, whatever the rectangle fields still hold", () => {
    const out = instrumentFormSchema.parse({ ...typed, shape: "circle", radiusDeg: "0.75", limitingMag: "21.5", filters: "" });
    expect(out.footprint).toEqual({ shape: "circle", radiusDeg: 0.75 });
    expect(out.filters).toEqual([]);
    expect(out.limitingMag).toBe(21.5);
    expect(instrumentCreateSchema.parse(out)).toEqual(out);
  });

  it.each([
    [{ name: "  " }, "name", "must not be empty"],
    [{ widthDeg: "" }, "widthDeg", "give a number"],
    [{ heightDeg: "ninety" }, "heightDeg", "give a number"],
    [{ heightDeg: "90" }, "heightDeg", "below 90°"],
    [{ widthDeg: "0" }, "widthDeg", "above 0"],
    [{ shape: "circle" }, "radiusDeg", "give a number"],
    [{ shape: "circle", radiusDeg: "91" }, "radiusDeg", "at most 90°"],
    [{ exposureS: "" }, "exposureS", "give a number"],
    [{ exposureS: "1.5" }, "exposureS", "whole seconds"],
    [{ overheadS: "-1" }, "overheadS", "at least 0 s"],
    [{ limitingMag: "40" }, "limitingMag", "at most 35"],
    [{ limitingMag: "bright" }, "limitingMag", "give a number"],
    [{ filters: "g, this-name-is-far-too-long" }, "filters", "at most 20 characters"],
  ])("refuses %j on %s", (change, path, message) => {
    expect(firstIssue({ ...typed, ...change })).toEqual([path, message]);
  });
});
