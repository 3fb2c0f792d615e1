// `fakes/run-all.ts` as the dev command runs it: starts both fakes, prints one line each, and
// stops cleanly on SIGTERM. Ports come from the environment; 0 here so the test never collides.
import { spawn } from "node:child_process";
import { once } from "node:events";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";

const root = fileURLToPath(new URL("../../", import.meta.url));

describe("fakes/run-all.ts", () => {
  it("announces both fakes, serves them, and exits 0 on SIGTERM", async () => {
    const child = spawn(process.execPath, ["--import", "tsx", "fakes/run-all.ts"], {
      cwd: root,
      env: { ...process.env, FAKE_PUSH_PORT: "0", FAKE_SMTP_PORT: "0", FAKE_SMTP_HTTP_PORT: "0" },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let output = "";
    child.stdout.on("data", (chunk: Buffer) => (output += chunk.toString()));
    child.stderr.on("data", (chunk: Buffer) => (output += chunk.toString()));
    try {
      for (let waitedMs = 0; !/fake smtp/.test(output) && waitedMs < 20_000; waitedMs += 50) {
        await new Promise((resolve) => setTimeout(resolve, 50));
      }
      const pushUrl = /fake push\s+(http:\/\/\S+)/.exec(output)?.[1];
      const smtpMatch = /fake smtp\s+smtp:\/\/\S+:(\d+)\s+inbox (http:\/\/\S+)\/messages/.exec(output);
      expect(pushUrl, output).toBeDefined();
      expect(smtpMatch, output).not.toBeNull();
      expect(Number(smtpMatch?.[1])).toBeGreaterThan(0);

      const registered = await fetch(`${pushUrl}/_admin/subscriptions`, { method: "POST" });
      expect(registered.status).toBe(201);
      expect(((await registered.json()) as { endpoint: string }).endpoint).toMatch(new RegExp(`^${pushUrl}/push/`));
      expect(await (await fetch(`${smtpMatch?.[2]}/messages`)).json()).toEqual([]);
    } finally {
      const exited = once(child, "exit");
      child.kill("SIGTERM");
      const [code] = (await exited) as [number | null];
      expect(code).toBe(0);
    }
    expect(output).toMatch(/fakes stopped \(SIGTERM\)/);
  });
});
