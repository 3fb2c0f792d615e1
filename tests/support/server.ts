import { spawn, type ChildProcess } from "node:child_process";
import { randomBytes } from "node:crypto";
import { createServer } from "node:net";
import webpush from "web-push";

export async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.unref();
    srv.on("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const address = srv.address();
      srv.close(() => (typeof address === "object" && address ? resolve(address.port) : reject(new Error("no port"))));
    });
  });
}

/** A complete production environment with fresh secrets, pointing at the given database and fakes. */
export function productionEnv(options: { port: number; databaseUrl: string; smtpPort: number; distDir: string }): Record<string, string> {
  const vapid = webpush.generateVAPIDKeys();
  const secret = () => randomBytes(32).toString("base64url");
  return {
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    NEXT_DIST_DIR: options.distDir,
    PORT: String(options.port),
    DATABASE_URL: options.databaseUrl,
    NEXTAUTH_URL: `http://localhost:${options.port}`,
    APP_URL: `http://localhost:${options.port}`,
    NEXTAUTH_SECRET: secret(),
    FEED_SIGNING_SECRET: secret(),
    ACK_LINK_SECRET: secret(),
    VAPID_PUBLIC_KEY: vapid.publicKey,
    VAPID_PRIVATE_KEY: vapid.privateKey,
    VAPID_SUBJECT: "mailto:e2e@chirpdesk.invalid",
    SMTP_URL: `smtp://127.0.0.1:${options.smtpPort}`,
    MAIL_FROM: "Chirpdesk <e2e@chirpdesk.invalid>",
  };
}

/** Starts `next start` in its own process group, so stopping it stops everything it spawned. */
export function startProcess(command: string, args: string[], env: Record<string, string>, label: string): ChildProcess {
  const child = spawn(command, args, { env: { ...process.env, ...env }, detached: true, stdio: ["ignore", "pipe", "pipe"] });
  const prefix = (chunk: Buffer) =>
    chunk
      .toString()
      .split("\n")
      .filter(Boolean)
      .map((l) => `  [${label}] ${l}`)
      .join("\n");
  child.stdout?.on("data", (c: Buffer) => process.env.E2E_VERBOSE && console.log(prefix(c)));
  child.stderr?.on("data", (c: Buffer) => console.error(prefix(c)));
  return child;
}

export function stopProcess(child: ChildProcess | undefined): void {
  if (!child?.pid || child.exitCode !== null) return;
  try {
    process.kill(-child.pid, "SIGTERM");
  } catch {
    // already gone
  }
}

export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      const res = await fetch(url, { redirect: "manual" });
      if (res.status < 500) return;
    } catch {
      // not up yet
    }
    if (Date.now() > deadline) throw new Error(`${url} did not answer within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 250));
  }
}
