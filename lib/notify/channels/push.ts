import https from "node:https";
import net from "node:net";
import { isP256PublicKey, isPushAuthSecret } from "@/lib/validations/push-keys";
import webpush from "web-push";
import type { WebPushError } from "web-push";

export interface VapidConfig {
  publicKey: string;
  privateKey: string;
  subject: string;
}

export interface PushTarget {
  endpoint: string;
  p256dh: string;
  auth: string;
}

export type PushAttempt =
  | { ok: true; status: number }
  /** gone: 404/410, drop the subscription; permanent: retrying will not help */
  | { ok: false; gone: boolean; permanent: boolean; status: number | null; error: string };

export interface PushSendOptions {
  /** RFC 8030 Section 5.4: 1–32 base64url characters; a newer message with the same topic replaces an undelivered one */
  topic?: string;
  ttlSeconds: number;
  urgency: "very-low" | "low" | "normal" | "high";
}

/**
 * An https.Agent (the only kind web-push accepts) whose sockets are plain TCP, for http:// endpoints such as the
 * local fake push service; web-push always calls https.request.
 */
class PlainHttpAgent extends https.Agent {
  override createConnection(options: net.NetConnectOpts): net.Socket {
    return net.createConnection(options);
  }
}

function isWebPushError(error: unknown): error is WebPushError {
  return typeof error === "object" && error !== null && "statusCode" in error;
}

/** Web Push (RFC 8030) with VAPID (RFC 8292) and aes128gcm payload encryption (RFC 8291), through `web-push`. */
export function createPushSender(vapid: VapidConfig, options: { timeoutMs?: number } = {}) {
  const plainAgent = new PlainHttpAgent({ keepAlive: true });
  const secureAgent = new https.Agent({ keepAlive: true });
  const timeout = options.timeoutMs ?? 10_000;
  return {
    async send(target: PushTarget, payload: string, opts: PushSendOptions): Promise<PushAttempt> {
      // Keys stored before they were checked at subscription: no retry can encrypt to them, so the subscription ends.
      if (!isP256PublicKey(target.p256dh) || !isPushAuthSecret(target.auth)) {
        return { ok: false, gone: true, permanent: true, status: null, error: "subscription keys are not a valid P-256 key and 16-byte secret" };
      }
      try {
        const result = await webpush.sendNotification({ endpoint: target.endpoint, keys: { p256dh: target.p256dh, auth: target.auth } }, payload, {
          vapidDetails: vapid,
          TTL: opts.ttlSeconds,
          urgency: opts.urgency,
          ...(opts.topic ? { topic: opts.topic } : {}),
          timeout,
          agent: target.endpoint.startsWith("http:") ? plainAgent : secureAgent,
        });
        return { ok: true, status: result.statusCode };
      } catch (error) {
        if (!isWebPushError(error)) {
          return { ok: false, gone: false, permanent: false, status: null, error: error instanceof Error ? error.message : String(error) };
        }
        const status = error.statusCode;
        const gone = status === 404 || status === 410;
        // 429 and 5xx are the push service's temporary troubles; other 4xx mean this request will never be taken.
        const permanent = gone || (status >= 400 && status < 500 && status !== 429 && status !== 408);
        const detail = typeof error.body === "string" && error.body ? `: ${error.body.slice(0, 200)}` : "";
        return { ok: false, gone, permanent, status, error: `push service answered ${status}${detail}` };
      }
    },
    close(): void {
      plainAgent.destroy();
      secureAgent.destroy();
    },
  };
}

export type PushSender = ReturnType<typeof createPushSender>;

/** RFC 8030 topic from a candidate id (a UUID without dashes is 32 hex characters). */
export function topicFor(candidateId: string | null | undefined): string | undefined {
  if (!candidateId) return undefined;
  const topic = candidateId.replace(/[^A-Za-z0-9_-]/g, "").slice(0, 32);
  return topic.length > 0 ? topic : undefined;
}
