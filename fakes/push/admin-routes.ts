// The fake's own JSON admin API under /_admin, for tests, the dev mailbox-style pages and other processes.
import { parseSinceAfter } from "../message-filter";
import type { Reply } from "./push-route";
import type { FakePushSubscription, MessageFilter, PushStore, StoredPushMessage } from "./store";

export function subscriptionJson(s: FakePushSubscription) {
  return {
    id: s.id,
    endpoint: s.endpoint,
    applicationServerKey: s.applicationServerKey,
    gone: s.gone,
    createdAt: s.createdAt.toISOString(),
  };
}

export function messageJson(m: StoredPushMessage) {
  return {
    id: m.id,
    seq: m.seq,
    subscriptionId: m.subscriptionId,
    endpoint: m.endpoint,
    location: m.location,
    receivedAt: m.receivedAt.toISOString(),
    ttlSeconds: m.ttlSeconds,
    urgency: m.urgency,
    topic: m.topic,
    contentEncoding: m.contentEncoding,
    sizeBytes: m.body.length,
    body: m.body.toString("base64url"),
    headers: m.headers,
    vapid: m.vapid,
  };
}

/** The shared `since`/`after` filter plus `subscription`. */
function parseFilter(query: URLSearchParams): MessageFilter | string {
  const filter = parseSinceAfter(query);
  if (typeof filter === "string") return filter;
  const subscription = query.get("subscription");
  return subscription === null ? filter : { ...filter, subscriptionId: subscription };
}

function isRecord(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === "object" && !Array.isArray(value);
}

const bad = (error: string): Reply => ({ status: 400, json: { error } });

export function handleAdmin(
  method: string,
  path: string,
  query: URLSearchParams,
  body: unknown,
  store: PushStore,
  origin: string,
): Reply {
  if (path === "/_admin/subscriptions" && method === "POST") {
    const key = isRecord(body) ? body.applicationServerKey : undefined;
    if (key !== undefined && key !== null && (typeof key !== "string" || Buffer.from(key, "base64url").length !== 65)) {
      return bad("applicationServerKey must be a base64url 65-byte P-256 public key");
    }
    return { status: 201, json: subscriptionJson(store.register(origin, typeof key === "string" ? key : null)) };
  }
  if (path === "/_admin/subscriptions" && method === "GET") {
    return { status: 200, json: store.listSubscriptions().map(subscriptionJson) };
  }
  const gone = /^\/_admin\/subscriptions\/([^/]+)\/gone$/.exec(path);
  if (gone?.[1] && method === "POST") {
    return store.markGone(decodeURIComponent(gone[1]))
      ? { status: 200, json: subscriptionJson(store.subscription(decodeURIComponent(gone[1])) as FakePushSubscription) }
      : { status: 404, json: { error: "no such subscription" } };
  }
  if (path === "/_admin/messages" && method === "GET") {
    const filter = parseFilter(query);
    return typeof filter === "string" ? bad(filter) : { status: 200, json: store.messages(filter).map(messageJson) };
  }
  if (path === "/_admin/messages" && method === "DELETE") {
    store.clearMessages();
    return { status: 204 };
  }
  if (path === "/_admin/reset" && method === "POST") {
    store.reset();
    return { status: 204 };
  }
  if (path === "/_admin/outage" && method === "GET") return { status: 200, json: store.outage };
  if (path === "/_admin/outage" && method === "PUT") {
    if (!isRecord(body) || typeof body.down !== "boolean") return bad("body must be { down: boolean, status?, retryAfterSeconds? }");
    const status = body.status ?? 503;
    if (typeof status !== "number" || !Number.isInteger(status) || status < 400 || status > 599) {
      return bad("status must be a 4xx or 5xx code");
    }
    const retry = body.retryAfterSeconds ?? null;
    if (retry !== null && (typeof retry !== "number" || !Number.isInteger(retry) || retry < 0)) {
      return bad("retryAfterSeconds must be a non-negative integer");
    }
    store.outage = { down: body.down, status, retryAfterSeconds: retry };
    return { status: 200, json: store.outage };
  }
  return { status: 404, json: { error: `no admin route ${method} ${path}` } };
}
