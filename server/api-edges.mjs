// Preloaded into the Next.js server (through server/preload.mjs). Two answers Next gives API callers in the wrong
// shape, made JSON like every other API error ({ error, requestId, reason }):
// - a path under /api/ whose %-encoding does not decode (a stray "%", "%zz", bytes that are not UTF-8) is refused
//   with 400 before Next tries to route it (Next would answer a bare text 500);
// - a method an existing /api/ route does not export: Next answers 405 with no body and no Allow header, which
//   RFC 9110 §15.5.6 requires. Next knows each route's methods and lists them in the Allow header of its
//   automatic OPTIONS answer, so the route files stay the one source of truth: on such a 405 this asks the same
//   server for OPTIONS on the same path and sends its Allow header with a JSON body.
import http from "node:http";
import { randomUUID } from "node:crypto";

const PROBE_TIMEOUT_MS = 2000;

/** True when the path (before any query) decodes as %-encoded UTF-8. */
export function decodablePath(url) {
  const path = url.split("?", 1)[0];
  try {
    decodeURIComponent(path);
    return true;
  } catch {
    return false;
  }
}

function isApiPath(url) {
  return url === "/api" || url.startsWith("/api/") || url.startsWith("/api?");
}

function sendJson(res, originalEnd, status, body, headers, headOnly) {
  const text = JSON.stringify(body);
  res.statusCode = status;
  res.setHeader("content-type", "application/json");
  res.setHeader("content-length", Buffer.byteLength(text));
  res.setHeader("cache-control", "no-store");
  for (const [name, value] of Object.entries(headers)) res.setHeader(name, value);
  originalEnd.call(res, headOnly ? undefined : text);
}

/** The Allow header of the server's own OPTIONS answer for this path, or null. */
function probeAllow(req) {
  const socket = req.socket;
  return new Promise((resolve) => {
    const probe = http.request(
      {
        host: socket.localAddress,
        port: socket.localPort,
        method: "OPTIONS",
        path: req.url,
        headers: { host: req.headers.host ?? `localhost:${socket.localPort}` },
        timeout: PROBE_TIMEOUT_MS,
      },
      (answer) => {
        answer.resume();
        const allow = answer.headers.allow;
        resolve(answer.statusCode && answer.statusCode < 300 && typeof allow === "string" ? allow : null);
      },
    );
    probe.on("timeout", () => probe.destroy());
    probe.on("error", () => resolve(null));
    probe.end();
  });
}

/** True when writeHead's optional headers argument (object or flat array) sets a content type. */
function setsContentType(args) {
  const headers = args.find((a) => a && typeof a === "object");
  if (!headers) return false;
  if (Array.isArray(headers)) return headers.some((v, i) => i % 2 === 0 && String(v).toLowerCase() === "content-type");
  return Object.keys(headers).some((k) => k.toLowerCase() === "content-type");
}

/**
 * Holds back Next's bodiless 405 for this request (no content type: every answer of handler() has one) and
 * answers it as JSON with an Allow header instead. Next sends it as writeHead(405) then end(); whichever of
 * writeHead, flushHeaders, write or end comes first decides, so nothing reaches the socket before the probe.
 */
function answerBare405AsJson(req, res) {
  const original = { writeHead: res.writeHead, flushHeaders: res.flushHeaders, write: res.write, end: res.end };
  let holding = false;
  const bare = () => res.statusCode === 405 && !res.headersSent && !res.getHeader("content-type");
  res.writeHead = function holdWriteHead(status, ...rest) {
    if (!holding && status === 405 && !res.headersSent && !res.getHeader("content-type") && !setsContentType(rest)) {
      holding = true;
      res.statusCode = 405;
      return res;
    }
    return holding ? res : original.writeHead.call(res, status, ...rest);
  };
  res.flushHeaders = function holdFlushHeaders() {
    if (!holding && bare()) holding = true;
    if (!holding) original.flushHeaders.call(res);
  };
  res.write = function holdWrite(chunk, ...rest) {
    if (!holding && bare()) holding = true;
    if (!holding) return original.write.call(res, chunk, ...rest);
    // Next's 405 has no body; anything written here is dropped with it.
    const callback = rest.find((a) => typeof a === "function");
    if (callback) process.nextTick(callback);
    return true;
  };
  res.end = function endWithJson405(...args) {
    if (!holding && bare()) holding = true;
    Object.assign(res, original);
    if (!holding) return original.end.apply(res, args);
    const callback = args.find((a) => typeof a === "function");
    const path = req.url.split("?", 1)[0];
    probeAllow(req).then((allow) => {
      const allowed = allow ? allow.split(",").map((m) => m.trim()).filter(Boolean) : [];
      const message = allowed.length
        ? `${req.method} is not allowed on ${path}; allowed: ${allowed.join(", ")}`
        : `${req.method} is not allowed on ${path}`;
      const body = { error: message, requestId: randomUUID(), reason: "method-not-allowed", allowed };
      sendJson(res, original.end, 405, body, allow ? { allow } : {}, req.method === "HEAD");
      if (callback) res.once("finish", callback);
    });
    return res;
  };
}

/** What this preload does to one request before Next sees it; true when it answered the request itself. */
export function screenApiRequest(req, res) {
  const url = req.url ?? "/";
  if (!isApiPath(url)) return false;
  if (!decodablePath(url)) {
    const body = { error: "the request path is not valid %-encoded UTF-8", requestId: randomUUID(), reason: "malformed-path" };
    sendJson(res, res.end, 400, body, {}, req.method === "HEAD");
    return true;
  }
  if (req.method !== "OPTIONS") answerBare405AsJson(req, res);
  return false;
}

const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function emitScreened(event, ...args) {
  if (event === "request" && args[0] && args[1] && screenApiRequest(args[0], args[1])) return true;
  return emit.call(this, event, ...args);
};
