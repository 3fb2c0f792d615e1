// `npm run fakes` (tsx fakes/run-all.ts): the local stand-ins for outside services on fixed ports,
// up until SIGINT/SIGTERM. The detector feed (fakes/feed/) is started separately by the dev command.
import { startFakePush } from "./push/server";
import { startFakeSmtp } from "./smtp/server";

function portFromEnv(name: string, fallback: number): number {
  const raw = process.env[name];
  const port = raw === undefined || raw === "" ? fallback : Number(raw);
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`${name}=${String(raw)} is not a port`);
  return port;
}

const host = process.env.FAKE_HOST ?? "127.0.0.1";
const running: { name: string; close(): Promise<void> }[] = [];

try {
  const push = await startFakePush({ port: portFromEnv("FAKE_PUSH_PORT", 4010), host });
  running.push({ name: "push", close: push.close });
  console.log(`fake push   ${push.url}  endpoints ${push.url}/push/<id>  admin ${push.url}/_admin/messages`);

  const smtp = await startFakeSmtp({
    smtpPort: portFromEnv("FAKE_SMTP_PORT", 2525),
    httpPort: portFromEnv("FAKE_SMTP_HTTP_PORT", 2526),
    host,
  });
  running.push({ name: "smtp", close: smtp.close });
  console.log(`fake smtp   smtp://${smtp.host}:${smtp.smtpPort}  inbox ${smtp.httpUrl}/messages`);

  // Further fakes go here, each started, pushed onto `running` and announced in one line.
} catch (error) {
  console.error(`fakes failed to start: ${error instanceof Error ? error.message : String(error)}`);
  await Promise.allSettled(running.map((fake) => fake.close()));
  process.exit(1);
}

let stopping = false;
async function stop(signal: string): Promise<void> {
  if (stopping) return;
  stopping = true;
  const results = await Promise.allSettled(running.map((fake) => fake.close()));
  results.forEach((result, i) => {
    if (result.status === "rejected") console.error(`fake ${running[i]?.name ?? "?"} did not close: ${String(result.reason)}`);
  });
  console.log(`fakes stopped (${signal})`);
  process.exit(0);
}
process.once("SIGINT", () => void stop("SIGINT"));
process.once("SIGTERM", () => void stop("SIGTERM"));
