import { execFileSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { startFakePush } from "@/fakes/push/server";
import { startFakeSmtp } from "@/fakes/smtp/server";
import { signFeedBody } from "@/lib/feed/signature";
import { launchBrowser } from "@/tests/support/browser";
import { freePort, productionEnv, startProcess, stopProcess, waitForHttp } from "@/tests/support/server";
import type { E2EContext, E2ETest } from "./types";

/**
 * Browser tests: builds once (unless E2E_SKIP_BUILD=1), starts `next start` and a paging worker on a fresh
 * migrated and seeded database with the local fakes, and runs every tests/e2e/*.e2e.ts in Debian's Chromium.
 * Usage: npm run test:e2e [-- name-filter]
 */
const filter = process.argv[2];
const distDir = process.env.E2E_DIST_DIR ?? ".next-e2e";
const root = process.cwd();
const work = mkdtempSync(path.join(tmpdir(), "chirpdesk-e2e-"));
const artifactsDir = path.join(root, "test-results", "e2e");
mkdirSync(artifactsDir, { recursive: true });

if (process.env.E2E_SKIP_BUILD !== "1" || !existsSync(path.join(distDir, "BUILD_ID"))) {
  console.log(`building into ${distDir} …`);
  execFileSync("node", ["node_modules/next/dist/bin/next", "build"], {
    stdio: "inherit",
    env: { ...process.env, NEXT_DIST_DIR: distDir, NEXT_TELEMETRY_DISABLED: "1" },
  });
}

const push = await startFakePush();
const smtp = await startFakeSmtp();
const port = await freePort();
const databaseUrl = `file:${path.join(work, "e2e.db")}`;
const env: Record<string, string> = { ...productionEnv({ port, databaseUrl, smtpPort: smtp.smtpPort, distDir }), UPLOAD_DIR: path.join(work, "uploads") };

// Migrate and seed the demo scenario through the same script production uses.
execFileSync("node_modules/.bin/tsx", ["scripts/seed.ts"], { stdio: "inherit", env: { ...process.env, ...env, NODE_ENV: "development" } });

const server = startProcess("node", ["--import", "./server/preload.mjs", "node_modules/next/dist/bin/next", "start", "-p", String(port)], env, "app");
const worker = existsSync("scripts/worker.ts")
  ? startProcess("node_modules/.bin/tsx", ["scripts/worker.ts"], env, "worker")
  : undefined;
const baseUrl = `http://localhost:${port}`;

async function signIn(page: Page, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.fill("#email", email);
  await page.fill("#password", password);
  await page.click("button[type=submit]");
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 });
}

async function postCandidate(payload: unknown): Promise<{ status: number; body: Record<string, unknown> }> {
  const body = JSON.stringify(payload);
  const res = await fetch(`${baseUrl}/api/v1/feed/candidates`, {
    method: "POST",
    headers: { "content-type": "application/json", ...signFeedBody(env.FEED_SIGNING_SECRET ?? "", body, Date.now()) },
    body,
  });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> };
}

const MAX_ATTEMPTS = 2;
let passed = 0;
let failed = 0;
try {
  await waitForHttp(`${baseUrl}/sign-in`);
  const files = readdirSync("tests/e2e")
    .filter((f) => f.endsWith(".e2e.ts") && (!filter || f.includes(filter)))
    .sort();
  for (const file of files) {
    const mod = (await import(path.join(root, "tests/e2e", file))) as { default: E2ETest };
    const ctx: E2EContext = {
      baseUrl,
      env,
      databaseUrl,
      launchBrowser,
      signIn,
      postCandidate,
      fakes: { push, smtp },
      artifactsDir,
      log: (m) => console.log(`    ${m}`),
    };
    // A file that fails is run once more and both attempts are printed: one hung click on a loaded 2-core
    // machine should not sink a CI run, but a test that needs its second attempt is flaky and gets looked at.
    for (let attempt = 1; attempt <= MAX_ATTEMPTS; attempt++) {
      const started = Date.now();
      try {
        await mod.default(ctx);
        passed += 1;
        console.log(`✓ ${file} (${Date.now() - started} ms)${attempt > 1 ? ` — passed on attempt ${attempt} of ${MAX_ATTEMPTS}; the first failed (above)` : ""}`);
        break;
      } catch (error) {
        const last = attempt === MAX_ATTEMPTS;
        console.error(`✗ ${file}${last ? "" : ` (attempt ${attempt} of ${MAX_ATTEMPTS}; trying once more)`}: ${(error as Error).stack ?? String(error)}`);
        if (last) failed += 1;
      }
    }
  }
} finally {
  stopProcess(worker);
  stopProcess(server);
  await push.close();
  await smtp.close();
  rmSync(work, { recursive: true, force: true });
}
console.log(`\ne2e: ${passed} passed, ${failed} failed`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
