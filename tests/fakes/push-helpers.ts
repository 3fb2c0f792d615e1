// Two ways to make the real `web-push` package deliver to an http:// endpoint such as the fake's.
// web-push 3.6.7 always calls https.request (src/web-push-lib.js), so a plain-HTTP URL fails with
// a TLS "wrong version number" error unless one of these is used.
import https from "node:https";
import net from "node:net";
import type { RequestDetails } from "web-push";

/** An https.Agent (web-push only accepts those) whose sockets are plain TCP. */
export class PlainHttpAgent extends https.Agent {
  override createConnection(options: net.NetConnectOpts): net.Socket {
    return net.createConnection(options);
  }
}

/** Sends what webpush.generateRequestDetails() built with fetch, which speaks http: and https: alike. */
export function sendRequestDetails(details: RequestDetails, override: Record<string, string | null> = {}): Promise<Response> {
  const headers = new Headers();
  for (const [name, value] of Object.entries(details.headers)) {
    // fetch computes Content-Length itself.
    if (name.toLowerCase() !== "content-length") headers.set(name, String(value));
  }
  for (const [name, value] of Object.entries(override)) {
    if (value === null) headers.delete(name);
    else headers.set(name, value);
  }
  const body = details.body === null ? undefined : new Uint8Array(details.body);
  return fetch(details.endpoint, { method: details.method, headers, body });
}
