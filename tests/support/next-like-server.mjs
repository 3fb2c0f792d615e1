// A stand-in for Next's route answers, for testing the server preloads in a real process without a build:
// /api/v1/thing exports GET and PATCH (Next's automatic OPTIONS lists them in Allow; other methods get Next's
// bodiless 405), /api/v1/own-405 answers its own JSON 405, every other path echoes what it received.
// Usage: node --import ./server/preload.mjs tests/support/next-like-server.mjs (prints the port when listening)
import http from "node:http";

const server = http.createServer((req, res) => {
  const path = (req.url ?? "/").split("?", 1)[0];
  if (path === "/api/v1/thing") {
    if (req.method === "OPTIONS") {
      res.writeHead(204, { allow: "GET, HEAD, OPTIONS, PATCH" });
      return res.end();
    }
    if (req.method === "GET" || req.method === "HEAD" || req.method === "PATCH") {
      res.writeHead(200, { "content-type": "application/json" });
      return res.end(req.method === "HEAD" ? undefined : JSON.stringify({ ok: true }));
    }
    // Next sends its 405 as writeHead(405) then end(); a bare statusCode and end() is the other shape a handler may use.
    if (req.method === "PUT") {
      res.writeHead(405);
      return res.end(undefined, undefined);
    }
    res.statusCode = 405;
    return res.end();
  }
  if (path === "/api/v1/own-405") {
    res.writeHead(405, { "content-type": "application/json" });
    return res.end(JSON.stringify({ error: "the route's own answer" }));
  }
  res.writeHead(200, { "content-type": "application/json" });
  res.end(JSON.stringify({ echoed: req.url, method: req.method, peer: req.headers["x-chirpdesk-peer"] ?? null }));
});
server.listen(0, "127.0.0.1", () => {
  const address = server.address();
  console.log(`listening ${typeof address === "object" && address ? address.port : 0}`);
});
