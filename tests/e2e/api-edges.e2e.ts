import { request } from "node:http";
import { check, type E2EContext } from "./types";

interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  text: string;
}

/** A raw request (node:http sends the path byte for byte; fetch would re-encode it). */
function ask(baseUrl: string, method: string, path: string, headers: Record<string, string> = {}, body?: string): Promise<Answer> {
  const url = new URL(baseUrl);
  return new Promise((resolve, reject) => {
    const req = request({ host: url.hostname, port: url.port, method, path, headers }, (res) => {
      let text = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (text += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
    });
    req.on("error", reject);
    req.end(body);
  });
}

function json(answer: Answer, what: string): Record<string, unknown> {
  check(String(answer.headers["content-type"] ?? "").startsWith("application/json"), `${what}: content-type ${answer.headers["content-type"]}`);
  const body = JSON.parse(answer.text) as Record<string, unknown>;
  check(typeof body.error === "string" && /^[0-9a-f-]{36}$/.test(String(body.requestId)), `${what}: body ${answer.text}`);
  return body;
}

/** Issue 13 item 18 against the real server: malformed paths, wrong methods, unknown paths and an empty profile change. */
export default async function apiEdgesE2E(ctx: E2EContext): Promise<void> {
  for (const path of ["/api/v1/candidates/%zz", "/api/v1/candidates/%E0%A4%A", "/api/v1/%"]) {
    const res = await ask(ctx.baseUrl, "GET", path);
    check(res.status === 400, `GET ${path} answered ${res.status}: ${res.text.slice(0, 200)}`);
    check(json(res, path).reason === "malformed-path", `${path}: ${res.text}`);
  }

  for (const [method, path, allow] of [
    ["PUT", "/api/v1/me", "GET, HEAD, OPTIONS, PATCH"],
    ["DELETE", "/api/v1/board", "GET, HEAD, OPTIONS"],
    ["GET", "/api/v1/push/test", "OPTIONS, POST"],
  ] as const) {
    const res = await ask(ctx.baseUrl, method, path);
    check(res.status === 405, `${method} ${path} answered ${res.status}`);
    check(res.headers.allow === allow, `${method} ${path}: Allow "${res.headers.allow}", expected "${allow}"`);
    const body = json(res, `${method} ${path}`);
    check(body.reason === "method-not-allowed" && String(body.error).includes(allow), `${method} ${path}: ${res.text}`);
  }

  const unknown = await ask(ctx.baseUrl, "GET", "/api/v1/no-such-area");
  check(unknown.status === 404 && json(unknown, "unknown path").reason === "unknown-path", `unknown path answered ${unknown.status}`);

  // An empty profile change is a 422 naming what to give, not a 500 (signed in through the browser, its cookie reused).
  const { context, close } = await ctx.launchBrowser();
  try {
    const page = await context.newPage();
    await ctx.signIn(page, "ada@chirpdesk.test", "demo-shifter");
    const res = await page.request.patch(`${ctx.baseUrl}/api/v1/me`, { data: {}, headers: { origin: ctx.baseUrl } });
    check(res.status() === 422, `PATCH /api/v1/me {} answered ${res.status()}: ${await res.text()}`);
    check(/nothing to change/.test(((await res.json()) as { error: string }).error), "PATCH {} names what to give");
  } finally {
    await close();
  }
}
