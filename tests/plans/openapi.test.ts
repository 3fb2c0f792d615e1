import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { buildOpenApiDocument } from "@/lib/feed/openapi";

describe("the OpenAPI document describes the plan routes", () => {
  const doc = buildOpenApiDocument() as unknown as { paths: Record<string, Record<string, unknown>>; components: { schemas: Record<string, { properties?: Record<string, { default?: unknown }> }> } };

  it.each([
    ["app/api/v1/candidates/[id]/plans/route.ts", "/api/v1/candidates/{id}/plans"],
    ["app/api/v1/plans/[id]/route.ts", "/api/v1/plans/{id}"],
    ["app/api/v1/plans/[id]/export/route.ts", "/api/v1/plans/{id}/export"],
    ["app/api/v1/plans/[id]/pointings/[pointingId]/route.ts", "/api/v1/plans/{id}/pointings/{pointingId}"],
  ])("%s: every exported method", (file, apiPath) => {
    const methods = [...readFileSync(file, "utf8").matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => (m[1] ?? "").toLowerCase());
    expect(methods.length).toBeGreaterThan(0);
    expect(Object.keys(doc.paths[apiPath] ?? {}).sort()).toEqual(methods.sort());
  });

  it("the request schema comes from the zod schema, with the issue's defaults", () => {
    const props = doc.components.schemas.PlanRequest?.properties ?? {};
    expect(Object.keys(props).sort()).toEqual(["avoid", "end", "exposureS", "filter", "instrumentId", "level", "maxPointings", "start", "taskId"]);
    expect([props.level?.default, props.maxPointings?.default, props.avoid?.default]).toEqual([0.9, 500, "planned-and-observed"]);
    const refs = JSON.stringify(doc).match(/#\/components\/schemas\/[A-Za-z]+/g) ?? [];
    for (const ref of refs) expect(doc.components.schemas[ref.split("/").pop() as string]).toBeDefined();
  });
});
