import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { GET as eventsRoute } from "@/app/api/v1/events/route";
import { appendEvent, listEventsAfter } from "@/lib/data/events";
import { createEventStream, type WireEvent } from "@/lib/triage/event-stream";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";
import { callRoute, createCaller, rawCall, type Caller } from "./helpers/api";

let testDb: TestDatabase;
let reader: Caller;

beforeAll(async () => {
  process.env.EVENT_STREAM_POLL_MS = "50";
  testDb = await setupTestDatabase();
  reader = await createCaller("observer");
});
afterAll(() => testDb.cleanup());

async function addEvents(n: number, tag: string): Promise<number[]> {
  const db = await getDb();
  const ids: number[] = [];
  for (let i = 0; i < n; i++) {
    const e = await appendEvent(db, { kind: "candidate.note-added", candidateId: `c-${tag}`, data: { tag, i } });
    ids.push(e.id);
  }
  return ids;
}

/** Reads SSE frames from a response body until `count` events arrived; returns them and the comment lines seen. */
async function readFrames(body: ReadableStream<Uint8Array>, count: number, timeoutMs = 5000) {
  const reader = body.getReader();
  const decoder = new TextDecoder();
  const received: Array<{ id: number; event: WireEvent }> = [];
  const comments: string[] = [];
  let buffer = "";
  const deadline = Date.now() + timeoutMs;
  let pendingRead: Promise<ReadableStreamReadResult<Uint8Array>> | null = null;
  while (received.length < count && Date.now() < deadline) {
    pendingRead ??= reader.read();
    const timer = new Promise<"timeout">((resolve) => setTimeout(() => resolve("timeout"), Math.max(0, deadline - Date.now())));
    const result = await Promise.race([pendingRead, timer]);
    if (result === "timeout") break;
    pendingRead = null;
    const { done, value } = result;
    if (done) break;
    buffer += decoder.decode(value, { stream: true });
    let cut: number;
    while ((cut = buffer.indexOf("\n\n")) >= 0) {
      const frame = buffer.slice(0, cut);
      buffer = buffer.slice(cut + 2);
      const lines = frame.split("\n");
      comments.push(...lines.filter((l) => l.startsWith(":")));
      const idLine = lines.find((l) => l.startsWith("id: "));
      const dataLine = lines.find((l) => l.startsWith("data: "));
      if (idLine && dataLine) received.push({ id: Number(idLine.slice(4)), event: JSON.parse(dataLine.slice(6)) as WireEvent });
    }
  }
  return { received, comments, cancel: () => reader.cancel() };
}

describe("GET /api/v1/events", () => {
  it("refuses strangers and answers text/event-stream to readers", async () => {
    expect((await callRoute(eventsRoute, {})).status).toBe(401);
    const abort = new AbortController();
    const res = await rawCall(eventsRoute, { caller: reader, url: "http://localhost/api/v1/events", signal: abort.signal });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toContain("text/event-stream");
    abort.abort();
    await res.body?.cancel();
  });

  it("streams events after ?after= in order, then new ones as they are written", async () => {
    const before = await addEvents(3, "a");
    const abort = new AbortController();
    const first = before[0] ?? 0;
    const res = await rawCall(eventsRoute, { caller: reader, url: `http://localhost/api/v1/events?after=${first}`, signal: abort.signal });
    const body = res.body;
    if (!body) throw new Error("no body");
    const pending = readFrames(body, 4);
    const later = await addEvents(2, "b");
    const { received, cancel } = await pending;
    expect(received.map((r) => r.id)).toEqual([...before.slice(1), ...later].slice(0, 4));
    expect(received[0]?.event).toMatchObject({ kind: "candidate.note-added", candidateId: "c-a", data: { tag: "a", i: 1 } });
    abort.abort();
    await cancel();
  });

  it("resuming with Last-Event-ID gives exactly the missed events", async () => {
    const seen = await addEvents(2, "c");
    const lastSeen = seen.at(-1) ?? 0;
    const missed = await addEvents(5, "d");
    const abort = new AbortController();
    const res = await rawCall(eventsRoute, {
      caller: reader,
      url: "http://localhost/api/v1/events?after=0",
      headers: { "last-event-id": String(lastSeen) },
      signal: abort.signal,
    });
    const body = res.body;
    if (!body) throw new Error("no body");
    // Ask for one more than missed: nothing else may arrive before the deadline.
    const { received, cancel } = await readFrames(body, missed.length + 1, 800);
    expect(received.map((r) => r.id)).toEqual(missed);
    abort.abort();
    await cancel();
  });

  it("without a resume point starts from now (no backlog)", async () => {
    await addEvents(2, "old");
    const abort = new AbortController();
    const res = await rawCall(eventsRoute, { caller: reader, url: "http://localhost/api/v1/events", signal: abort.signal });
    const body = res.body;
    if (!body) throw new Error("no body");
    const pending = readFrames(body, 1);
    await new Promise((r) => setTimeout(r, 150));
    const fresh = await addEvents(1, "new");
    const { received, cancel } = await pending;
    expect(received.map((r) => r.id)).toEqual(fresh);
    abort.abort();
    await cancel();
  });

  it("the polling fallback answers the same events as JSON", async () => {
    const ids = await addEvents(3, "poll");
    const after = (ids[0] ?? 1) - 1;
    const res = await callRoute(eventsRoute, { caller: reader, url: `http://localhost/api/v1/events?mode=poll&after=${after}` });
    const events = res.json.events as WireEvent[];
    expect(events.map((e) => e.id)).toEqual(ids);
    expect(res.json.lastId).toBe(ids.at(-1));
  });
});

describe("the stream itself", () => {
  it("sends heartbeats while idle and stops reading the database once aborted", async () => {
    const abort = new AbortController();
    let reads = 0;
    const stream = createEventStream({
      afterId: 1_000_000,
      signal: abort.signal,
      pollMs: 10,
      heartbeatMs: 30,
      readEventsAfter: async (after, limit) => {
        reads += 1;
        return listEventsAfter(after, limit);
      },
    });
    const r = stream.getReader();
    const decoder = new TextDecoder();
    let text = "";
    while ((text.match(/: keep-alive/g) ?? []).length < 2) {
      const { value, done } = await r.read();
      if (done) break;
      text += decoder.decode(value);
    }
    expect(text.startsWith("retry: 3000\n")).toBe(true);
    abort.abort();
    await new Promise((resolve) => setTimeout(resolve, 50));
    const readsAtAbort = reads;
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(reads).toBe(readsAtAbort);
    expect((await r.read()).done).toBe(true);
  });
});
