import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { buildOpenApiDocument } from "@/lib/feed/openapi";

describe("the OpenAPI document describes the observation, coverage and counterpart routes", () => {
  const doc = buildOpenApiDocument() as unknown as { paths: Record<string, Record<string, unknown>>; components: { schemas: Record<string, { properties?: Record<string, unknown> }> } };

  it.each([
    ["app/api/v1/tasks/[id]/observations/route.ts", "/api/v1/tasks/{id}/observations"],
    ["app/api/v1/tasks/[id]/observations/csv/route.ts", "/api/v1/tasks/{id}/observations/csv"],
    ["app/api/v1/candidates/[id]/observations/route.ts", "/api/v1/candidates/{id}/observations"],
    ["app/api/v1/candidates/[id]/coverage/route.ts", "/api/v1/candidates/{id}/coverage"],
    ["app/api/v1/candidates/[id]/counterparts/route.ts", "/api/v1/candidates/{id}/counterparts"],
  ])("%s: every exported method", (file, apiPath) => {
    const methods = [...readFileSync(file, "utf8").matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)].map((m) => (m[1] ?? "").toLowerCase());
    expect(methods.length).toBeGreaterThan(0);
    expect(Object.keys(doc.paths[apiPath] ?? {}).sort()).toEqual(methods.sort());
  });

  it("request schemas come from the zod schemas; every reference resolves", () => {
    const row = (doc.components.schemas.ObservationsRequest?.properties?.observations as { items?: { properties?: Record<string, unknown> } }).items?.properties ?? {};
    expect(Object.keys(row).sort()).toEqual(["decDeg", "exposureS", "filter", "footprint", "instrumentId", "limitingMagnitude", "pointingIndex", "raDeg", "startTime"]);
    expect(Object.keys(doc.components.schemas.CounterpartRequest?.properties ?? {}).sort()).toEqual(["decDeg", "filter", "magnitude", "magnitudeError", "name", "notes", "observedAt", "raDeg"]);
    const refs = JSON.stringify(doc).match(/#\/components\/schemas\/[A-Za-z]+/g) ?? [];
    for (const ref of refs) expect(doc.components.schemas[ref.split("/").pop() as string]).toBeDefined();
  });
});
