import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { NextRequest } from "next/server";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET } from "@/app/api/v1/openapi.json/route";
import { createApiToken } from "@/lib/auth/api-tokens";
import { buildOpenApiDocument } from "@/lib/feed/openapi";
import { createTestUser, setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { setTestEnvironment } from "./support/feed-helpers";

let testDb: TestDatabase;
beforeAll(async () => {
  setTestEnvironment();
  testDb = await setupTestDatabase();
});
afterAll(() => testDb.cleanup());

const request = (token?: string) =>
  new NextRequest("http://localhost:3999/api/v1/openapi.json", { headers: token ? { authorization: `Bearer ${token}` } : {} });

describe("GET /api/v1/openapi.json", () => {
  it("needs a signed-in role", async () => {
    expect((await GET(request())).status).toBe(401);
  });

  it("serves an OpenAPI 3.1 document whose feed body schema is the issue's format", async () => {
    const observer = await createTestUser("observer");
    const { token } = await createApiToken(observer.id, "test");
    const res = await GET(request(token));
    expect(res.status).toBe(200);
    const doc = await res.json();
    expect(doc.openapi).toBe("3.1.0");
    expect(doc.servers).toEqual([{ url: "http://localhost:3999" }]);
    const feed = doc.components.schemas.FeedCandidate;
    // The body: ten required fields, three optional ones.
    expect([...feed.required].sort()).toEqual(
      ["source", "externalId", "revision", "stage", "eventTime", "detectors", "networkSnr", "falseAlarmRatePerYear", "frequencyTrack", "masses"].sort(),
    );
    expect(Object.keys(feed.properties).sort()).toEqual([...feed.required, "spins", "distanceMpc"].sort());
    expect(feed.properties.stage.enum).toEqual(["early-warning", "first-look", "confirmed", "revised", "withdrawn"]);
    expect(feed.additionalProperties).toBe(false);
    const post = doc.paths["/api/v1/feed/candidates"].post;
    expect(Object.keys(post.responses).sort()).toEqual(["200", "201", "400", "401", "413", "422", "503"]);
    expect(post.parameters.map((p: { name: string }) => p.name)).toEqual(["X-Feed-Timestamp", "X-Feed-Signature"]);
    expect(doc.paths["/api/v1/candidates/{id}"].get.responses["200"].content["application/json"].schema.$ref).toBe(
      "#/components/schemas/CandidateDetail",
    );
    // Every $ref points at a schema that exists.
    const refs = JSON.stringify(doc).match(/#\/components\/schemas\/[A-Za-z]+/g) ?? [];
    for (const ref of refs) expect(doc.components.schemas[ref.split("/").pop() as string]).toBeDefined();
  });

  it("documents every route the feed posts to, with the methods each exports", async () => {
    const doc = buildOpenApiDocument();
    const routes = readdirSync("app/api/v1/feed", { recursive: true, encoding: "utf8" }).filter((f) => f.endsWith("route.ts"));
    expect(routes.length).toBeGreaterThanOrEqual(2);
    for (const file of routes) {
      const apiPath = `/api/v1/feed/${path.dirname(file)}`.replace(/\[([^\]]+)\]/g, "{$1}");
      const methods = [...readFileSync(path.join("app/api/v1/feed", file), "utf8").matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)];
      expect(doc.paths, apiPath).toHaveProperty([apiPath]);
      for (const [, method] of methods) expect(doc.paths[apiPath as keyof typeof doc.paths], `${method} ${apiPath}`).toHaveProperty([method!.toLowerCase()]);
    }
  });
});
