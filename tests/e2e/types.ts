import type { BrowserContext, Page } from "playwright-core";
import type { FakePush } from "@/fakes/push/server";
import type { FakeSmtp } from "@/fakes/smtp/server";

/** What the runner (tests/e2e/run.ts) hands each `*.e2e.ts` file's default export. */
export interface E2EContext {
  baseUrl: string;
  /** the server's environment (secrets included), e.g. for signing feed posts */
  env: Record<string, string>;
  databaseUrl: string;
  launchBrowser(options?: { viewport?: { width: number; height: number } }): Promise<{ context: BrowserContext; close(): Promise<void> }>;
  signIn(page: Page, email: string, password: string): Promise<void>;
  /** POSTs a feed payload to /api/v1/feed/candidates with a valid signature; returns status and JSON. */
  postCandidate(payload: unknown): Promise<{ status: number; body: Record<string, unknown> }>;
  fakes: { push: FakePush; smtp: FakeSmtp };
  /** directory for screenshots worth keeping when a test fails */
  artifactsDir: string;
  log(message: string): void;
}

export type E2ETest = (ctx: E2EContext) => Promise<void>;

/** A failed expectation in a browser test. */
export function check(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(message);
}
