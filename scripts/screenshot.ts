import { launchBrowser } from "@/tests/support/browser";

/**
 * Signs in and screenshots a page, for looking at the product as a person would.
 * Usage: tsx scripts/screenshot.ts <path> <out.png> [email] [password] [width] [height]
 */
const [pagePath = "/", out = "/tmp/shot.png", email, password, width = "1440", height = "900"] = process.argv.slice(2);
const base = process.env.APP_URL ?? "http://localhost:3000";
const { context, close } = await launchBrowser({ viewport: { width: Number(width), height: Number(height) } });
const page = await context.newPage();
if (email && password) {
  await page.goto(`${base}/sign-in`);
  await page.fill("#email", email);
  await page.fill("#password", password);
  await page.click("button[type=submit]");
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"), { timeout: 30_000 });
}
await page.goto(base + pagePath, { waitUntil: "networkidle" });
await page.waitForTimeout(Number(process.env.SHOT_WAIT_MS ?? 800));
await page.screenshot({ path: out, fullPage: process.env.FULL_PAGE === "1" });
console.log(`saved ${out} (${page.url()})`);
await close();
