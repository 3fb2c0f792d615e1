import { signFeedBody } from "@/lib/feed/signature";
import type { FeedPost, Signing } from "./generator";

export const feedPath = "/api/v1/feed/candidates";

export interface PostOutcome {
  status: number;
  body: unknown;
  elapsedMs: number;
}

/** The headers for each way of signing; a "stale" signature is ten minutes old, outside the 5-minute window. */
export function signingHeaders(signing: Signing, secret: string, rawBody: string, nowMs: number): Record<string, string> {
  switch (signing) {
    case "good":
      return signFeedBody(secret, rawBody, nowMs);
    case "wrong-secret":
      return signFeedBody(`${secret}-not-the-secret`, rawBody, nowMs);
    case "stale":
      return signFeedBody(secret, rawBody, nowMs - 10 * 60_000);
    case "missing":
      return {};
  }
}

/** Sends one post, signed at the moment of sending. Network failures throw. */
export async function sendFeedPost(baseUrl: string, post: FeedPost, secret: string, now: () => number = Date.now): Promise<PostOutcome> {
  const started = performance.now();
  const response = await fetch(new URL(feedPath, baseUrl), {
    method: "POST",
    headers: { "content-type": "application/json", ...signingHeaders(post.signing, secret, post.rawBody, now()) },
    body: post.rawBody,
  });
  const text = await response.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    // keep the text
  }
  return { status: response.status, body, elapsedMs: performance.now() - started };
}

/** The feed's sky-map route for a candidate it posted. */
export function skymapPath(source: string, externalId: string): string {
  return `${feedPath}/${encodeURIComponent(source)}/${encodeURIComponent(externalId)}/skymap`;
}

/** A multipart body holding one file in the `file` field, as bytes (the signature covers exactly these). */
export async function multipartFile(name: string, bytes: Uint8Array): Promise<{ body: Uint8Array<ArrayBuffer>; contentType: string }> {
  const form = new FormData();
  form.append("file", new Blob([new Uint8Array(bytes)], { type: "application/fits" }), name);
  const request = new Request("http://localhost/", { method: "POST", body: form });
  return { body: new Uint8Array(await request.arrayBuffer()), contentType: request.headers.get("content-type") ?? "" };
}

/** Attaches a sky map to a posted candidate through the feed's sky-map route, signed at the moment of sending. */
export async function sendSkymap(
  baseUrl: string,
  target: { source: string; externalId: string },
  file: { name: string; bytes: Uint8Array },
  secret: string,
  now: () => number = Date.now,
): Promise<PostOutcome> {
  const started = performance.now();
  const { body, contentType } = await multipartFile(file.name, file.bytes);
  const response = await fetch(new URL(skymapPath(target.source, target.externalId), baseUrl), {
    method: "POST",
    headers: { "content-type": contentType, ...signFeedBody(secret, body, now()) },
    body,
  });
  const text = await response.text();
  let parsed: unknown = text;
  try {
    parsed = JSON.parse(text);
  } catch {
    // keep the text
  }
  return { status: response.status, body: parsed, elapsedMs: performance.now() - started };
}

const retryStatuses = new Set([502, 503, 504]);

/** Waits `ms`, or less if the signal aborts; leaves no listener behind either way. */
function sleep(ms: number, signal?: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    const done = () => {
      clearTimeout(timer);
      signal?.removeEventListener("abort", done);
      resolve();
    };
    const timer = setTimeout(done, ms);
    signal?.addEventListener("abort", done, { once: true });
  });
}

/**
 * Sends a post, waiting out an app that is not up yet (connection refused, 502–504) with exponential backoff
 * capped at 30 s. Says so once per outage through `log`. Returns null if aborted before an answer.
 */
export async function sendWithRetry(
  baseUrl: string,
  post: FeedPost,
  secret: string,
  options: { signal?: AbortSignal; log?: (line: string) => void; now?: () => number } = {},
): Promise<PostOutcome | null> {
  let delayMs = 1000;
  let told = false;
  while (!options.signal?.aborted) {
    try {
      const outcome = await sendFeedPost(baseUrl, post, secret, options.now);
      if (!retryStatuses.has(outcome.status)) return outcome;
    } catch {
      // connection refused or reset: the app is starting or restarting
    }
    if (!told) {
      options.log?.(`[feed] ${baseUrl} is not answering yet; retrying with backoff (up to 30 s)`);
      told = true;
    }
    await sleep(delayMs, options.signal);
    delayMs = Math.min(30_000, delayMs * 2);
  }
  return null;
}

export { sleep };
