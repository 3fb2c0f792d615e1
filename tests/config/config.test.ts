import { spawnSync } from "node:child_process";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { configVariables, defaultDatabaseUrl, parseConfig, requireSetting, servingProblems } from "@/lib/env";

const serving = {
  NEXTAUTH_URL: "http://desk.chirpdesk.test",
  NEXTAUTH_SECRET: "n".repeat(32),
  FEED_SIGNING_SECRET: "f".repeat(32),
  ACK_LINK_SECRET: "a".repeat(32),
  VAPID_PUBLIC_KEY: "p".repeat(40),
  VAPID_PRIVATE_KEY: "q".repeat(40),
  VAPID_SUBJECT: "mailto:desk@chirpdesk.test",
  SMTP_URL: "smtp://127.0.0.1:1",
  MAIL_FROM: "Chirpdesk <desk@chirpdesk.test>",
};
const servingNames = Object.keys(serving);

describe("the configuration schema", () => {
  it("knows every variable the product reads, the database URL with one default", () => {
    for (const name of ["DATABASE_URL", "DATABASE_AUTH_TOKEN", "APP_URL", "UPLOAD_DIR", "PHYSICS_THREADS", "EVENT_STREAM_POLL_MS", "FEED_NETWORK_SITES", "WORKER_POLL_MS", "WORKER_LEASE_MS", "WORKER_BATCH", "WORKER_CONCURRENCY", "WORKER_ID", ...servingNames]) {
      expect(configVariables).toContain(name);
    }
    const empty = parseConfig({});
    expect(empty.DATABASE_URL).toBe(defaultDatabaseUrl);
    expect(empty.EVENT_STREAM_POLL_MS).toBe(750);
    expect(empty.NEXTAUTH_SECRET).toBeUndefined();
  });

  it("treats an empty value as unset and converts numbers and lists", () => {
    const parsed = parseConfig({ DATABASE_URL: "", WORKER_BATCH: "7", FEED_NETWORK_SITES: "N1, W2,N1", DATABASE_AUTH_TOKEN: "" });
    expect(parsed.DATABASE_URL).toBe(defaultDatabaseUrl);
    expect(parsed.DATABASE_AUTH_TOKEN).toBeUndefined();
    expect(parsed.WORKER_BATCH).toBe(7);
    expect(parsed.FEED_NETWORK_SITES).toEqual(["N1", "W2"]);
  });

  it("names every malformed variable at once", () => {
    const attempt = () => parseConfig({ WORKER_POLL_MS: "-5", APP_URL: "not a url", FEED_NETWORK_SITES: "N1,lower", NEXTAUTH_SECRET: "short" });
    expect(attempt).toThrow(/WORKER_POLL_MS/);
    const message = (() => {
      try {
        attempt();
        return "";
      } catch (error) {
        return (error as Error).message;
      }
    })();
    for (const name of ["WORKER_POLL_MS", "APP_URL", "FEED_NETWORK_SITES", "NEXTAUTH_SECRET"]) expect(message).toContain(`${name}:`);
    expect(message).toContain("lower");
  });

  it("serving needs every secret: none missing passes, each missing one is named", () => {
    expect(servingProblems(serving)).toEqual([]);
    const problems = servingProblems({});
    expect(problems.map((line) => line.split(":")[0])).toEqual(servingNames);
    expect(servingProblems({ ...serving, SMTP_URL: "http://mail" })).toEqual([expect.stringMatching(/^SMTP_URL: /)]);
  });

  it("requireSetting returns a present value and names an absent one", () => {
    expect(requireSetting("NEXTAUTH_SECRET", parseConfig(serving))).toBe(serving.NEXTAUTH_SECRET);
    expect(() => requireSetting("NEXTAUTH_SECRET", parseConfig({}))).toThrow(/NEXTAUTH_SECRET: required/);
  });
});

describe("npm start", () => {
  it("refuses to start, naming every missing or malformed variable", () => {
    const env: Record<string, string> = { PATH: process.env.PATH ?? "", HOME: process.env.HOME ?? "", ...serving, VAPID_SUBJECT: "ops@nowhere", PORT: "99999" };
    delete env.NEXTAUTH_SECRET;
    delete env.MAIL_FROM;
    const tsx = path.join(process.cwd(), "node_modules", ".bin", "tsx");
    const run = spawnSync(tsx, ["scripts/start.ts"], { env: env as NodeJS.ProcessEnv, encoding: "utf8", timeout: 60_000 });
    expect(run.status).toBe(1);
    for (const name of ["NEXTAUTH_SECRET", "MAIL_FROM", "VAPID_SUBJECT", "PORT"]) expect(run.stderr).toContain(`${name}:`);
    expect(run.stderr).not.toContain("FEED_SIGNING_SECRET:");
  });
});
