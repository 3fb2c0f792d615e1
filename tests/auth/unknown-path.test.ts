import { NextRequest } from "next/server";
import { describe, expect, it } from "vitest";
import * as unknown from "@/app/api/[...unknown]/route";

describe("an /api path no route claims", () => {
  it("answers JSON 404 with a request id for every method, signed in or not", async () => {
    for (const method of ["GET", "POST", "PUT", "PATCH", "DELETE"] as const) {
      const res = await unknown[method](new NextRequest("http://localhost/api/v1/no-such-thing/7", { method }), {
        params: Promise.resolve({ unknown: ["v1", "no-such-thing", "7"] }),
      });
      expect(res.status, method).toBe(404);
      expect(res.headers.get("content-type")).toMatch(/application\/json/);
      const body = await res.json();
      expect(body).toMatchObject({ error: "no API route at /api/v1/no-such-thing/7", reason: "unknown-path" });
      expect(body.requestId).toMatch(/[0-9a-f-]{36}/);
    }
  });
});
