import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { buildOpenApiDocument } from "@/lib/feed/openapi";

describe("the OpenAPI document describes the galaxy routes", () => {
  const doc = buildOpenApiDocument() as unknown as { paths: Record<string, Record<string, unknown>>; components: { schemas: Record<string, unknown> } };

  it.each([
    ["app/api/v1/catalogues/route.ts", "/api/v1/catalogues"],
    ["app/api/v1/catalogues/[id]/route.ts", "/api/v1/catalogues/{id}"],
    ["app/api/v1/candidates/[id]/galaxies/route.ts", "/api/v1/candidates/{id}/galaxies"],
  ])("%s: every exported method", (file, apiPath) => {
    const methods = [...readFileSync(file, "utf8").matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => (m[1] ?? "").toLowerCase());
    expect(methods.length).toBeGreaterThan(0);
    expect(Object.keys(doc.paths[apiPath] ?? {}).sort()).toEqual(methods.sort());
  });

  it("every schema it refers to is defined", () => {
    const refs = JSON.stringify(doc).match(/#\/components\/schemas\/[A-Za-z]+/g) ?? [];
    for (const ref of refs) expect(doc.components.schemas[ref.split("/").pop() as string]).toBeDefined();
  });
});
