// Preloaded into the Next.js server (`node --require ./server/peer-address.cjs …/next start`).
// Route handlers never see the socket, and Next keeps a client's own X-Forwarded-For, so a client could claim any
// address. This stamps every request with the socket's peer address under a header no client can set (an incoming
// copy is overwritten), and tells the app, through the process environment, that the stamp is real.
"use strict";
const http = require("node:http");

const HEADER = "x-chirpdesk-peer";
const emit = http.Server.prototype.emit;
http.Server.prototype.emit = function emitWithPeer(event, req) {
  if (event === "request" && req && req.headers) req.headers[HEADER] = (req.socket && req.socket.remoteAddress) || "";
  // eslint-disable-next-line prefer-rest-params
  return emit.apply(this, arguments);
};
process.env.CHIRPDESK_PEER_HEADER = HEADER;
