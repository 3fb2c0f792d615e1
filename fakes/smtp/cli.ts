// `tsx fakes/smtp/cli.ts [smtpPort] [httpPort]` — runs the fake SMTP server alone
// (defaults FAKE_SMTP_PORT or 2525, FAKE_SMTP_HTTP_PORT or 2526).
import { startFakeSmtp } from "./server";

const smtpPort = Number(process.argv[2] ?? process.env.FAKE_SMTP_PORT ?? 2525);
const httpPort = Number(process.argv[3] ?? process.env.FAKE_SMTP_HTTP_PORT ?? 2526);
for (const port of [smtpPort, httpPort]) {
  if (!Number.isInteger(port) || port < 0 || port > 65535) throw new Error(`bad port ${String(port)}`);
}

const fake = await startFakeSmtp({ smtpPort, httpPort, host: process.env.FAKE_HOST ?? "127.0.0.1" });
console.log(`fake smtp   smtp://${fake.host}:${fake.smtpPort}  inbox ${fake.httpUrl}/messages`);
const stop = () => void fake.close().then(() => process.exit(0));
process.once("SIGINT", stop);
process.once("SIGTERM", stop);
