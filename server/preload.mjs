// Everything preloaded into the Next.js server: `node --import ./server/preload.mjs node_modules/next/dist/bin/next …`
// (scripts/start.ts, scripts/dev.ts, tests/e2e/run.ts). Order matters: the peer stamp is applied to every request,
// so it is installed last and runs first.
import "./api-edges.mjs";
import "./peer-address.mjs";
