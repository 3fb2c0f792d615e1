import { readdirSync } from "node:fs";
import { tmpdir } from "node:os";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as feedSkymap } from "@/app/api/v1/feed/candidates/[source]/[externalId]/skymap/route";
import { signFeedBody } from "@/lib/feed/signature";
import { rowCounts, setupSkymapTest, type SkymapTestEnv } from "./helpers";

let env: SkymapTestEnv;
const SECRET = "f".repeat(48);
const NOW_MS = Date.UTC(2030, 2, 20, 12, 0, 0);
const route = feedSkymap.with({ now: () => NOW_MS, feedSecret: () => SECRET });
const params = { params: Promise.resolve({ source: "pipe-a", externalId: "ext-1" }) };

beforeAll(async () => {
  env = await setupSkymapTest();
});
afterAll(() => env.cleanup());

/** A body of `chunks` × 64 kB that counts how much of it the server pulled. */
function countedBody(chunks: number) {
  const seen = { chunks: 0 };
  const stream = new ReadableStream<Uint8Array>({
    pull(controller) {
      if (seen.chunks >= chunks) return controller.close();
      seen.chunks += 1;
      controller.enqueue(new Uint8Array(64 * 1024).fill(65));
    },
  });
  return { stream, seen };
}

function post(body: ReadableStream<Uint8Array>, headers: Record<string, string>) {
  const init = { method: "POST", body, headers: { "content-type": "multipart/form-data; boundary=x", ...headers }, duplex: "half" };
  return new Request("http://localhost/api/v1/feed/candidates/pipe-a/ext-1/skymap", init as RequestInit);
}

const spoolFiles = () => readdirSync(tmpdir()).filter((name) => name.startsWith("chirpdesk-feed-"));

describe("a sky-map upload from the feed is judged before its body is read", () => {
  it("refuses a post without signature headers (401) having read none of a large body", async () => {
    const { stream, seen } = countedBody(3200); // 200 MB if drained
    const res = await route(post(stream, {}), params);
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/missing X-Feed-Timestamp or X-Feed-Signature/);
    expect(seen.chunks).toBeLessThan(4); // the stream machinery primes a chunk or two ahead; never drained (3200)
  });

  it("refuses a stale timestamp (401) before reading", async () => {
    const { stream, seen } = countedBody(3200);
    const stale = signFeedBody(SECRET, "", NOW_MS - 3600_000);
    const res = await route(post(stream, stale), params);
    expect(res.status).toBe(401);
    expect(seen.chunks).toBeLessThan(4);
  });

  it("refuses a declared Content-Length over the limit (413) before reading", async () => {
    const { stream, seen } = countedBody(3200);
    const headers = { ...signFeedBody(SECRET, "", NOW_MS), "content-length": String(300 * 1024 * 1024) };
    const res = await route(post(stream, headers), params);
    expect(res.status).toBe(413);
    expect(seen.chunks).toBeLessThan(4);
  });

  it("streams a wrongly signed body through the MAC to a temporary file, refuses it (401), keeps nothing", async () => {
    const before = await rowCounts();
    const spooled = spoolFiles();
    const { stream, seen } = countedBody(400); // 25 MB: over the in-memory threshold, so it is spooled
    const res = await route(post(stream, signFeedBody(SECRET, "something else", NOW_MS)), params);
    expect(res.status).toBe(401);
    expect((await res.json()).error).toMatch(/signature does not match/);
    expect(seen.chunks).toBe(400);
    expect(spoolFiles()).toEqual(spooled);
    expect(await rowCounts()).toEqual(before);
  });
});
