/**
 * Runs tests/e2e/boards.e2e.ts against an already running server (e.g. a dev server on its own database),
 * for iterating without the full build the e2e runner does. Usage:
 *   APP_URL=http://localhost:3107 tsx tests/boards/helpers/e2e-local.ts
 * Reads FEED_SIGNING_SECRET from .env.local like the server does.
 */
import { mkdirSync, readFileSync } from "node:fs";
import type { Page } from "playwright-core";
import boardsE2E from "../../e2e/boards.e2e";
import { launchBrowser } from "@/tests/support/browser";
import { signFeedBody } from "@/lib/feed/signature";
import type { E2EContext } from "../../e2e/types";

const baseUrl = process.env.APP_URL ?? "http://localhost:3107";
const secret = /^FEED_SIGNING_SECRET=(.*)$/m.exec(readFileSync(".env.local", "utf8"))?.[1]?.trim() ?? "";
mkdirSync("/tmp/boards-e2e", { recursive: true });

const ctx = {
  baseUrl,
  env: {},
  databaseUrl: "",
  launchBrowser,
  async signIn(page: Page, email: string, password: string) {
    await page.goto(`${baseUrl}/sign-in`);
    await page.fill("#email", email);
    await page.fill("#password", password);
    await page.click("button[type=submit]");
    await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 60_000 });
  },
  async postCandidate(payload: unknown) {
    const body = JSON.stringify(payload);
    const res = await fetch(`${baseUrl}/api/v1/feed/candidates`, {
      method: "POST",
      headers: { "content-type": "application/json", ...signFeedBody(secret, body, Date.now()) },
      body,
    });
    return { status: res.status, body: (await res.json()) as Record<string, unknown> };
  },
  artifactsDir: "/tmp/boards-e2e",
  log: (m: string) => console.log(`    ${m}`),
} as unknown as E2EContext;

const started = Date.now();
await boardsE2E(ctx);
console.log(`✓ boards.e2e.ts (${Date.now() - started} ms)`);
