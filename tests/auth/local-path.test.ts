import { describe, expect, it } from "vitest";
import { localPathOr } from "@/lib/auth/local-path";

describe("the sign-in page's return path", () => {
  it("keeps paths on this site, query included", () => {
    expect(localPathOr("/candidates/abc?tab=revisions", "/")).toBe("/candidates/abc?tab=revisions");
    expect(localPathOr("/", "/triage")).toBe("/");
  });

  it("refuses anything a browser would read as another site, and nothing at all", () => {
    for (const path of ["//evil.example", "/\\evil.example", "https://evil.example", "evil", "", undefined]) {
      expect(localPathOr(path, "/"), String(path)).toBe("/");
    }
  });
});
