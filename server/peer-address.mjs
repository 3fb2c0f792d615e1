// Preloaded into the Next.js server through server/preload.mjs (`node --import ./server/preload.mjs …/next start`).
// Route handlers never see the socket, and Next keeps a client's own X-Forwarded-For, so a client could claim any
// address. This stamps every request with the socket's peer address under a header no client can set (an incoming
// copy is overwritten), and tells the app, through the process environment, that the stamp is real.
import http from "node:http";

const HEADER = "x-chirpdesk-peer";
const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function emitWithPeer(event, ...args) {
  const req = args[0];
  if (event === "request" && req && req.headers) req.headers[HEADER] = (req.socket && req.socket.remoteAddress) || "";
  return emit.call(this, event, ...args);
};
process.env.CHIRPDESK_PEER_HEADER = HEADER;
