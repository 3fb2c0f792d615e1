import { spawn, type ChildProcess } from "node:child_process";
import { request } from "node:http";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

/**
 * server/preload.mjs in a real process, asked over a socket with raw paths (no client-side URL clean-up): a
 * stand-in server answers the way Next's route modules do (tests/support/next-like-server.mjs). The same answers
 * from the real `next start` are checked by tests/e2e/api-edges.e2e.ts.
 */
let child: ChildProcess;
let port = 0;

beforeAll(async () => {
  child = spawn(process.execPath, ["--import", "./server/preload.mjs", "tests/support/next-like-server.mjs"], { stdio: ["ignore", "pipe", "inherit"] });
  port = await new Promise<number>((resolve, reject) => {
    let out = "";
    child.stdout?.on("data", (chunk: Buffer) => {
      out += chunk.toString();
      const match = /listening (\d+)/.exec(out);
      if (match) resolve(Number(match[1]));
    });
    child.on("exit", (code) => reject(new Error(`stand-in server exited with ${code}`)));
  });
}, 60_000);

afterAll(() => {
  child?.kill();
});

interface Answer {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  text: string;
}

function ask(method: string, path: string): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const req = request({ host: "127.0.0.1", port, method, path }, (res) => {
      let text = "";
      res.setEncoding("utf8");
      res.on("data", (c: string) => (text += c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
    });
    req.on("error", reject);
    req.end();
  });
}

describe("%-malformed paths under /api/", () => {
  it.each(["/api/v1/candidates/%zz", "/api/v1/%", "/api/v1/candidates/%E0%A4%A", "/api/v1/candidates/%C0%AF", "/api/v1/x/%ED%A0%80?q=1"])(
    "%s answers JSON 400 with a request id",
    async (path) => {
      const res = await ask("GET", path);
      expect(res.status).toBe(400);
      expect(res.headers["content-type"]).toMatch(/^application\/json/);
      const body = JSON.parse(res.text) as Record<string, unknown>;
      expect(body).toMatchObject({ reason: "malformed-path", error: expect.stringMatching(/%-encoded/) });
      expect(body.requestId).toMatch(/^[0-9a-f-]{36}$/);
    },
  );

  it("well-formed encodings, a malformed query and paths outside /api/ reach the server untouched", async () => {
    for (const path of ["/api/v1/candidates/caf%C3%A9", "/api/v1/candidates/a%20b?x=%zz", "/triage/%zz", "/apis/%zz"]) {
      const res = await ask("GET", path);
      expect(res.status, path).toBe(200);
      expect(JSON.parse(res.text), path).toMatchObject({ echoed: path, peer: "127.0.0.1" });
    }
  });

  it("a HEAD request gets the 400 without a body", async () => {
    const res = await ask("HEAD", "/api/v1/%zz");
    expect(res.status).toBe(400);
    expect(res.text).toBe("");
  });
});

describe("a method the route does not export", () => {
  it.each(["PUT", "DELETE", "POST"])("%s answers JSON 405 with the route's Allow header", async (method) => {
    const res = await ask(method, "/api/v1/thing?x=1");
    expect(res.status).toBe(405);
    expect(res.headers.allow).toBe("GET, HEAD, OPTIONS, PATCH");
    expect(res.headers["content-type"]).toMatch(/^application\/json/);
    const body = JSON.parse(res.text) as Record<string, unknown>;
    expect(body).toMatchObject({
      reason: "method-not-allowed",
      allowed: ["GET", "HEAD", "OPTIONS", "PATCH"],
      error: `${method} is not allowed on /api/v1/thing; allowed: GET, HEAD, OPTIONS, PATCH`,
    });
    expect(body.requestId).toMatch(/^[0-9a-f-]{36}$/);
  });

  it("allowed methods and OPTIONS are answered by the route as before", async () => {
    expect((await ask("PATCH", "/api/v1/thing")).status).toBe(200);
    const options = await ask("OPTIONS", "/api/v1/thing");
    expect(options.status).toBe(204);
    expect(options.headers.allow).toBe("GET, HEAD, OPTIONS, PATCH");
  });

  it("a route's own JSON 405 is left as it is", async () => {
    const res = await ask("POST", "/api/v1/own-405");
    expect(res.status).toBe(405);
    expect(res.headers.allow).toBeUndefined();
    expect(JSON.parse(res.text)).toEqual({ error: "the route's own answer" });
  });
});
