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

  it("refuses paths a browser turns into another site once it drops tabs and newlines", () => {
    // "?callbackUrl=/%09/evil.example" arrives decoded as "/\t/evil.example"; a browser reads it as "//evil.example".
    for (const path of ["/\t/evil.example", "/\n/evil.example", "/\r\n/evil.example", "/%0a", "/\u0000x", "/ /\\evil"]) {
      const kept = localPathOr(path, "/");
      expect(kept === "/" || !new URL(kept, "http://a.test").host.includes("evil"), JSON.stringify(path)).toBe(true);
      expect(kept, JSON.stringify(path)).not.toMatch(/[\u0000-\u001f]/);
    }
    expect(localPathOr("/\t/evil.example", "/")).toBe("/");
    expect(localPathOr("/a\nb", "/")).toBe("/");
  });

  it("answers the normalised path, so what is redirected to is what was checked", () => {
    expect(localPathOr("/a/../triage?x=1#top", "/")).toBe("/triage?x=1#top");
    expect(localPathOr("/sites/a b", "/")).toBe("/sites/a%20b");
  });
});
