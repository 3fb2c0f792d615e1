// `tsx fakes/push/cli.ts [port]` — runs the fake push service alone (default port FAKE_PUSH_PORT or 4010).
import { startFakePush } from "./server";

const port = Number(process.argv[2] ?? process.env.FAKE_PUSH_PORT ?? 4010);
if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`bad port ${String(port)}`);

const fake = await startFakePush({ port, host: process.env.FAKE_HOST ?? "127.0.0.1" });
console.log(`fake push   ${fake.url}  endpoints ${fake.url}/push/<id>, admin ${fake.url}/_admin/messages`);
const stop = () => void fake.close().then(() => process.exit(0));
process.once("SIGINT", stop);
process.once("SIGTERM", stop);
