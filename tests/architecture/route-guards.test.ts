import { describe, expect, it } from "vitest";
import { listSourceFiles, readSource } from "@/tests/support/source-tree";

const root = process.cwd();
// next-auth's own route is next-auth's handler, not ours.
const routeFiles = listSourceFiles(root, ["app"]).filter((file) => file.endsWith("/route.ts") && !file.includes("[...nextauth]"));
const methods = "GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS";

/** The method names a route file exports, each with the expression it exports. */
function exportedMethods(text: string): Array<{ method: string; made: string }> {
  const found: Array<{ method: string; made: string }> = [];
  for (const match of text.matchAll(new RegExp(`export\\s+(?:async\\s+)?(?:const|function|let|var)\\s+(${methods})\\b\\s*(=\\s*([\\w.]+)\\s*\\(?)?`, "g"))) {
    found.push({ method: match[1] ?? "", made: match[3] ?? "(a function declaration)" });
  }
  return found;
}

describe("every route declares its guard once, through handler()", () => {
  it("finds the route files", () => {
    expect(routeFiles.length).toBeGreaterThan(40);
  });

  it("exports only handlers made by handler(...), directly or through one local constant", () => {
    const offenders: string[] = [];
    for (const file of routeFiles) {
      const text = readSource(root, file);
      const exported = exportedMethods(text);
      if (exported.length === 0) offenders.push(`${file}: exports no method`);
      for (const { method, made } of exported) {
        const direct = made === "handler";
        const viaLocal = new RegExp(`const\\s+${made}\\s*=\\s*handler\\(`).test(text);
        if (!direct && !viaLocal) offenders.push(`${file}: ${method} is ${made}`);
      }
      if (/export\s*\{/.test(text) || /export\s+default/.test(text)) offenders.push(`${file}: re-exports or default export`);
    }
    expect(offenders).toEqual([]);
  });

  it("reads path parameters only through a zod schema (no `params.x ?? \"\"` fallbacks)", () => {
    const offenders = routeFiles.filter((file) => /params\.\w+\s*\?\?/.test(readSource(root, file)));
    expect(offenders).toEqual([]);
  });

  it("the checker tells a hand-written handler from one made by handler()", () => {
    expect(exportedMethods("export async function POST(req) {}")).toEqual([{ method: "POST", made: "(a function declaration)" }]);
    expect(exportedMethods("export const GET = handler({ roles: can.read }, f);")).toEqual([{ method: "GET", made: "handler" }]);
  });
});
