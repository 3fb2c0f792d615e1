// `POST /push/<subscription-id>`: accepting a push message as a push service does (RFC 8030 Section 5).
import type { IncomingHttpHeaders } from "node:http";
import { parseAes128gcmHeader } from "./decrypt";
import type { PushStore, Urgency } from "./store";
import { verifyVapid } from "./vapid";

/** RFC 8030 Section 7.2: a push service must accept at least 4096 octets and may refuse more with 413. */
export const MAX_PUSH_BODY_BYTES = 4096;

const URGENCIES: readonly Urgency[] = ["very-low", "low", "normal", "high"];

export interface Reply {
  status: number;
  headers?: Record<string, string>;
  json?: unknown;
}

const fault = (status: number, reason: string, headers?: Record<string, string>): Reply => ({
  status,
  headers,
  json: { error: reason },
});

function single(headers: IncomingHttpHeaders, name: string): string | undefined {
  const value = headers[name];
  return Array.isArray(value) ? value.join(", ") : value;
}

function flatHeaders(headers: IncomingHttpHeaders): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [name, value] of Object.entries(headers)) {
    if (value !== undefined) out[name] = Array.isArray(value) ? value.join(", ") : value;
  }
  return out;
}

export interface PushRequest {
  subscriptionId: string;
  headers: IncomingHttpHeaders;
  body: Buffer;
  /** True when the body ran past MAX_PUSH_BODY_BYTES (and was not kept whole). */
  bodyTooLarge: boolean;
}

export function acceptPushMessage(request: PushRequest, store: PushStore, nowMs: number): Reply {
  const { outage } = store;
  if (outage.down) {
    const headers = outage.retryAfterSeconds === null ? undefined : { "retry-after": String(outage.retryAfterSeconds) };
    return fault(outage.status, "push service unavailable (outage switch on)", headers);
  }
  const subscription = store.subscription(request.subscriptionId);
  if (!subscription) return fault(404, "no such subscription");
  if (subscription.gone) return fault(410, "subscription has expired or was unsubscribed");
  if (request.bodyTooLarge) return fault(413, `payload over ${MAX_PUSH_BODY_BYTES} bytes`);

  const host = single(request.headers, "host");
  if (!host) return fault(400, "missing Host");
  const origin = `http://${host}`;
  const vapid = verifyVapid(single(request.headers, "authorization"), {
    audience: origin,
    nowMs,
    requiredPublicKey: subscription.applicationServerKey ?? undefined,
  });
  if (!vapid.ok) {
    return fault(vapid.status, vapid.reason, vapid.status === 401 ? { "www-authenticate": "vapid" } : undefined);
  }

  const ttlText = single(request.headers, "ttl");
  if (ttlText === undefined || !/^\d+$/.test(ttlText.trim())) {
    return fault(400, "TTL header is required and must be a non-negative integer of seconds");
  }
  const urgency = (single(request.headers, "urgency")?.trim().toLowerCase() ?? "normal") as Urgency;
  if (!URGENCIES.includes(urgency)) return fault(400, `Urgency must be one of ${URGENCIES.join(", ")}`);
  // RFC 8030 Section 5.4: at most 32 characters from the URL- and filename-safe base64 alphabet.
  const topic = single(request.headers, "topic")?.trim() ?? null;
  if (topic !== null && !/^[A-Za-z0-9_-]{1,32}$/.test(topic)) {
    return fault(400, "Topic must be 1-32 characters of the base64url alphabet");
  }
  const contentEncoding = single(request.headers, "content-encoding")?.trim().toLowerCase() ?? null;
  if (request.body.length > 0) {
    if (contentEncoding !== "aes128gcm") return fault(400, "payloads must use Content-Encoding: aes128gcm (RFC 8291)");
    try {
      const header = parseAes128gcmHeader(request.body);
      if (header.keyId.length !== 65) return fault(400, "aes128gcm keyid must be the sender's 65-byte public key");
      if (request.body.length <= header.headerLengthBytes + 16) return fault(400, "aes128gcm body has no record");
    } catch (error) {
      return fault(400, error instanceof Error ? error.message : "bad aes128gcm header");
    }
  }

  const ttlSeconds = Number(ttlText.trim());
  const stored = store.add(
    {
      subscriptionId: subscription.id,
      endpoint: subscription.endpoint,
      body: Buffer.from(request.body),
      ttlSeconds,
      contentEncoding,
      urgency,
      topic,
      headers: flatHeaders(request.headers),
      vapid: { publicKey: vapid.publicKey, sub: vapid.claims.sub, exp: vapid.claims.exp },
    },
    origin,
  );
  // RFC 8030 Section 5: 201 Created, Location names the push message resource; TTL echoes what was kept.
  return { status: 201, headers: { location: stored.location, ttl: String(ttlSeconds) } };
}
