import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { chromium, type BrowserContext } from "playwright-core";

export const chromiumPath = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";

/** Debian's Chromium, headless, in a throw-away profile (flags per shared/STACK.md). */
export async function launchBrowser(options: { viewport?: { width: number; height: number } } = {}): Promise<{
  context: BrowserContext;
  close(): Promise<void>;
}> {
  const profile = mkdtempSync(path.join(tmpdir(), "chirpdesk-chromium-"));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath,
    headless: true,
    viewport: options.viewport ?? { width: 1440, height: 900 },
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--disable-dev-shm-usage",
    ],
  });
  return {
    context,
    async close() {
      await context.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
