import { randomBytes } from "node:crypto";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import webpush from "web-push";
import { defaultDatabaseUrl } from "@/lib/env";

/**
 * Writes `.env.local` with freshly generated secrets when it is absent, and adds any key a newer version needs.
 * Development only: production reads every secret from the environment.
 */
export function ensureEnvFile(file = ".env.local", port = Number(process.env.PORT ?? 3000)): Record<string, string> {
  const existing = existsSync(file) ? parseEnv(readFileSync(file, "utf8")) : {};
  const vapid = existing.VAPID_PUBLIC_KEY ? null : webpush.generateVAPIDKeys();
  const secret = () => randomBytes(32).toString("base64url");
  const wanted: Record<string, string> = {
    DATABASE_URL: defaultDatabaseUrl,
    NEXTAUTH_URL: `http://localhost:${port}`,
    NEXTAUTH_SECRET: secret(),
    FEED_SIGNING_SECRET: secret(),
    ACK_LINK_SECRET: secret(),
    VAPID_PUBLIC_KEY: vapid?.publicKey ?? "",
    VAPID_PRIVATE_KEY: vapid?.privateKey ?? "",
    VAPID_SUBJECT: "mailto:desk@chirpdesk.invalid",
    SMTP_URL: "smtp://127.0.0.1:2525",
    MAIL_FROM: "Chirpdesk <desk@chirpdesk.invalid>",
    DEV_MAILBOX_URL: "http://127.0.0.1:2526",
    FAKE_PUSH_PORT: "4010",
    FAKE_SMTP_PORT: "2525",
    FAKE_SMTP_HTTP_PORT: "2526",
  };
  const added = Object.keys(wanted).filter((k) => existing[k] === undefined);
  if (added.length > 0) {
    const lines = added.map((k) => `${k}=${wanted[k]}`);
    const header = existsSync(file) ? "" : "# Written by `npm run dev` with freshly generated secrets. Never commit this file.\n";
    writeFileSync(file, (existsSync(file) ? readFileSync(file, "utf8").replace(/\n?$/, "\n") : header) + lines.join("\n") + "\n");
  }
  return { ...wanted, ...existing };
}

export function parseEnv(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const line of text.split(/\r?\n/)) {
    const m = /^\s*([A-Z0-9_]+)\s*=\s*(.*)\s*$/.exec(line);
    if (m?.[1]) out[m[1]] = (m[2] ?? "").replace(/^"(.*)"$/, "$1");
  }
  return out;
}

/** Loads `.env.local` into process.env without overriding what the shell already set. */
export function loadEnvFile(file = ".env.local"): void {
  if (!existsSync(file)) return;
  for (const [k, v] of Object.entries(parseEnv(readFileSync(file, "utf8")))) {
    if (process.env[k] === undefined) process.env[k] = v;
  }
}
