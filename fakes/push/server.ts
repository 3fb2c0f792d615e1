// A local stand-in for a browser vendor's push service: accepts Web Push messages (RFC 8030) with
// VAPID (RFC 8292), stores the still-encrypted bodies, and offers a JSON admin API on the same port.
import { createServer } from "node:http";
import type { IncomingMessage, ServerResponse } from "node:http";
import type { AddressInfo } from "node:net";
import { handleAdmin } from "./admin-routes";
import { acceptPushMessage, MAX_PUSH_BODY_BYTES } from "./push-route";
import type { Reply } from "./push-route";
import { PushStore } from "./store";
import type { FakePushSubscription, MessageFilter, OutageState, StoredPushMessage } from "./store";

export type { FakePushSubscription, MessageFilter, OutageState, StoredPushMessage } from "./store";

/** Bodies beyond this are not even drained; the connection is cut. */
const MAX_DRAIN_BYTES = 1024 * 1024;

export interface FakePushOptions {
  /** 0 (default) picks a free port. */
  port?: number;
  /** Default 127.0.0.1. */
  host?: string;
  /** Clock for VAPID expiry checks and receivedAt; defaults to Date.now. */
  now?: () => number;
}

export interface FakePush {
  /** Origin, e.g. `http://127.0.0.1:4010`. Endpoints are `${url}/push/<id>`. */
  url: string;
  port: number;
  close(): Promise<void>;
  messages(filter?: MessageFilter): StoredPushMessage[];
  subscriptions(): FakePushSubscription[];
  /** What a browser's PushManager.subscribe() would obtain from its vendor: an endpoint URL. */
  registerSubscription(options?: { applicationServerKey?: string }): FakePushSubscription;
  /** Later pushes to this subscription answer 410 Gone. */
  markGone(subscriptionId: string): boolean;
  clearMessages(): void;
  reset(): void;
  /** While down, every push answers `status` (default 503), with Retry-After when given. */
  setDown(down: boolean, options?: { status?: number; retryAfterSeconds?: number }): void;
  outage(): OutageState;
  onMessage(listener: (message: StoredPushMessage) => void): () => void;
  /** Resolves once `count` messages match `filter`; rejects after `timeoutMs` (default 10 s). */
  waitForMessages(count: number, options?: MessageFilter & { timeoutMs?: number }): Promise<StoredPushMessage[]>;
}

interface ReadBody {
  body: Buffer;
  tooLarge: boolean;
}

function readBody(req: IncomingMessage, keepBytes: number): Promise<ReadBody> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let total = 0;
    req.on("data", (chunk: Buffer) => {
      total += chunk.length;
      if (total > MAX_DRAIN_BYTES) {
        req.destroy();
        return;
      }
      if (total <= keepBytes) chunks.push(chunk);
    });
    req.on("end", () => resolve({ body: Buffer.concat(chunks), tooLarge: total > keepBytes }));
    req.on("error", reject);
    req.on("close", () => {
      if (total > MAX_DRAIN_BYTES) reject(new Error("request body too large to drain"));
    });
  });
}

function send(res: ServerResponse, reply: Reply): void {
  const headers: Record<string, string> = { ...reply.headers };
  let payload: string | undefined;
  if (reply.json !== undefined) {
    payload = JSON.stringify(reply.json);
    headers["content-type"] = "application/json; charset=utf-8";
  }
  res.writeHead(reply.status, headers);
  res.end(payload);
}

function parseJson(body: Buffer): unknown {
  if (body.length === 0) return undefined;
  try {
    return JSON.parse(body.toString("utf8"));
  } catch {
    return undefined;
  }
}

export async function startFakePush(options: FakePushOptions = {}): Promise<FakePush> {
  const host = options.host ?? "127.0.0.1";
  const now = options.now ?? Date.now;
  const store = new PushStore(now);
  let origin = "";

  const server = createServer((req, res) => {
    void (async () => {
      const url = new URL(req.url ?? "/", "http://fake.invalid");
      const method = req.method ?? "GET";
      const push = /^\/push\/([^/]+)$/.exec(url.pathname);
      if (push?.[1]) {
        if (method !== "POST") return send(res, { status: 405, headers: { allow: "POST" } });
        const { body, tooLarge } = await readBody(req, MAX_PUSH_BODY_BYTES);
        const request = { subscriptionId: decodeURIComponent(push[1]), headers: req.headers, body, bodyTooLarge: tooLarge };
        return send(res, acceptPushMessage(request, store, now()));
      }
      if (url.pathname.startsWith("/_admin/")) {
        const { body, tooLarge } = await readBody(req, 64 * 1024);
        if (tooLarge) return send(res, { status: 413, json: { error: "admin body too large" } });
        return send(res, handleAdmin(method, url.pathname, url.searchParams, parseJson(body), store, origin));
      }
      req.resume();
      send(res, { status: 404, json: { error: "not a push resource" } });
    })().catch((error: unknown) => {
      if (!res.headersSent) send(res, { status: 500, json: { error: String(error) } });
      else res.destroy();
    });
  });

  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(options.port ?? 0, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  origin = `http://${host.includes(":") ? `[${host}]` : host}:${port}`;

  return {
    url: origin,
    port,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      }),
    messages: (filter) => store.messages(filter),
    subscriptions: () => store.listSubscriptions(),
    registerSubscription: (opts = {}) => store.register(origin, opts.applicationServerKey ?? null),
    markGone: (id) => store.markGone(id),
    clearMessages: () => store.clearMessages(),
    reset: () => store.reset(),
    setDown: (down, opts = {}) => {
      store.outage = { down, status: opts.status ?? 503, retryAfterSeconds: opts.retryAfterSeconds ?? null };
    },
    outage: () => store.outage,
    onMessage: (listener) => store.onMessage(listener),
    waitForMessages: (count, opts = {}) => waitFor(store, count, opts),
  };
}

function waitFor(
  store: PushStore,
  count: number,
  options: MessageFilter & { timeoutMs?: number },
): Promise<StoredPushMessage[]> {
  const { timeoutMs = 10_000, ...filter } = options;
  return new Promise((resolve, reject) => {
    const check = (): boolean => {
      const found = store.messages(filter);
      if (found.length < count) return false;
      clearTimeout(timer);
      unsubscribe();
      resolve(found);
      return true;
    };
    const timer = setTimeout(() => {
      unsubscribe();
      reject(new Error(`fake push: ${store.messages(filter).length} of ${count} messages after ${timeoutMs} ms`));
    }, timeoutMs);
    const unsubscribe = store.onMessage(() => void check());
    check();
  });
}
