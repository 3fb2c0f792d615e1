import path from "node:path";
import type { Page } from "playwright-core";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

const fixture = (name: string) => path.resolve("tests/fixtures/skymap", name);

/** Non-transparent pixels of the first canvas under a selector: the map was drawn. */
async function paintedPixels(page: Page, selector: string): Promise<number> {
  return page.evaluate((sel) => {
    const canvas = document.querySelector<HTMLCanvasElement>(`${sel} canvas`);
    const ctx = canvas?.getContext("2d");
    if (!canvas || !ctx) return 0;
    const { data } = ctx.getImageData(0, 0, canvas.width, canvas.height);
    let n = 0;
    for (let i = 3; i < data.length; i += 4) if ((data[i] ?? 0) > 0) n++;
    return n;
  }, selector);
}

/**
 * Sky maps in the browser (issue 8): a shifter uploads a fixture map from the candidate page with a visible
 * progress bar (the upload is throttled so progress can be seen), the maps draw, a malformed file is refused with
 * its reason, an observer gets no upload control, and the sites page shows forms only to coordinators.
 */
export default async function skymapE2E(ctx: E2EContext): Promise<void> {
  const externalId = `SKYMAP-E2E-${Date.now()}`;
  const posted = await ctx.postCandidate(candidatePayload({ externalId, eventTime: new Date() }));
  check(posted.status === 201, `posting the candidate answered ${posted.status}`);
  const candidateId = String(posted.body.id);

  const { context, close } = await ctx.launchBrowser({ viewport: { width: 1440, height: 1000 } });
  try {
    const page = await context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await ctx.signIn(page, "ada@chirpdesk.test", "demo-shifter");
    await page.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    await page.getByText("No sky map yet").waitFor({ timeout: 30_000 });

    // A malformed file is refused with the reason, and nothing is shown as stored.
    await page.setInputFiles('[data-testid="skymap-file-input"]', fixture("malformed/nans.fits"));
    const refusal = await page.waitForSelector('[data-testid="skymap-upload-error"]', { timeout: 30_000 });
    const reason = await refusal.innerText();
    check(/NaN/.test(reason), `malformed upload message: "${reason}"`);

    // Throttle the upload to ~40 kB/s so the 114 kB file takes a few seconds and progress can be watched.
    const cdp = await context.newCDPSession(page);
    await cdp.send("Network.enable");
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 20, downloadThroughput: -1, uploadThroughput: 40 * 1024 });
    await page.setInputFiles('[data-testid="skymap-file-input"]', fixture("bimodal-multiorder.fits.gz"));
    await page.waitForSelector('[data-testid="upload-progress"]', { timeout: 10_000 });
    const seen = new Set<number>();
    for (let i = 0; i < 80; i++) {
      const text = await page.locator('[data-testid="upload-percent"]').innerText().catch(() => null);
      if (text === null) break;
      seen.add(Number.parseInt(text, 10));
      await page.waitForTimeout(100);
    }
    await cdp.send("Network.emulateNetworkConditions", { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    const partial = [...seen].filter((p) => p > 0 && p < 100);
    check(partial.length > 0, `upload progress never showed an intermediate percentage: ${[...seen].join(", ")}`);
    ctx.log(`upload progress seen: ${[...seen].sort((a, b) => a - b).join(" → ")} %`);

    // The numbers (healpy reference 1359.7 deg²) and both views, drawn.
    const area90 = await page.locator('[data-testid="area90"]').innerText({ timeout: 30_000 });
    // one unbreakable piece: a no-break space between the number and its unit
    check(area90 === "1,360\u00a0deg²", `90 % area shown as "${area90}"`);
    await page.waitForSelector('[data-testid="skymap-views"] canvas', { timeout: 30_000 });
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="skymap-views"] canvas').length === 2, undefined, { timeout: 30_000 });
    let painted = 0;
    for (let i = 0; i < 40 && painted < 2000; i++) {
      painted = await paintedPixels(page, '[data-testid="skymap-views"]');
      if (painted < 2000) await page.waitForTimeout(250);
    }
    check(painted >= 2000, `the all-sky canvas has only ${painted} painted pixels`);
    const labels = await page.locator('[data-testid="skymap-views"] svg text').allTextContents();
    check(labels.includes("12h") && labels.includes("Sun"), `grid labels or Sun missing: ${labels.slice(0, 20).join(" ")}`);
    await page.waitForSelector('[data-testid="visibility-table"] tbody tr', { timeout: 30_000 });
    const caution = await page.locator('[data-testid="skymap-panel"] [role="note"]').innerText();
    check(/take precedence/.test(caution), "the caution text is missing beside the sky-map numbers");
    await page.evaluate(() => window.scrollTo(0, 0));
    await page.screenshot({ path: path.join(ctx.artifactsDir, "skymap-candidate.png"), fullPage: true });
    check(errors.length === 0, `page errors: ${errors.join("; ")}`);

    // The shifter is done: close the page (its live refresh and sky-map canvases) before the next person signs in.
    await cdp.detach();
    await page.close();

    // An observer sees the map but gets no upload control.
    await context.clearCookies();
    const observer = await context.newPage();
    await ctx.signIn(observer, "bram@chirpdesk.test", "demo-observer");
    await observer.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    await observer.locator('[data-testid="area90"]').waitFor({ timeout: 30_000 });
    check((await observer.locator('[data-testid="skymap-file-input"]').count()) === 0, "an observer was offered the sky-map upload");
    await observer.goto(`${ctx.baseUrl}/sites`);
    await observer.waitForSelector('[data-testid="sites-table"]', { timeout: 30_000 });
    check((await observer.getByRole("button", { name: "Add site" }).count()) === 0, "an observer was offered Add site");
    await observer.waitForSelector('[data-testid="instruments-table-ALD"]', { timeout: 30_000 });
    check((await observer.getByRole("button", { name: /^Add an instrument/ }).count()) === 0, "an observer was offered Add instrument");
    check((await observer.getByRole("button", { name: /^Edit ALD / }).count()) === 0, "an observer was offered an instrument's Edit");
    await observer.waitForSelector('[data-testid="tonight-table"]', { timeout: 30_000 });
    const tonight = await observer.locator('[data-testid="tonight-table"]').innerText();
    check(tonight.includes(externalId), `tonight's table does not list ${externalId}`);
    await observer.screenshot({ path: path.join(ctx.artifactsDir, "skymap-sites.png"), fullPage: true });
    await observer.close();

    await context.clearCookies();
    const coordinator = await context.newPage();
    await ctx.signIn(coordinator, "cleo@chirpdesk.test", "demo-coordinator");
    await coordinator.goto(`${ctx.baseUrl}/sites`);
    await coordinator.waitForSelector('[data-testid="sites-table"]', { timeout: 30_000 });
    await coordinator.getByRole("button", { name: "Add site" }).click();
    // A code and name of this run's own, so a second attempt (tests/e2e/run.ts) does not meet the first one's site.
    const siteTag = Date.now().toString(36).slice(-6).toUpperCase();
    const siteName = `Test Hill ${siteTag} (fictional)`;
    await coordinator.fill("#site-code", `E2E-${siteTag}`);
    await coordinator.fill("#site-name", siteName);
    await coordinator.fill("#site-latitudeDeg", "95");
    await coordinator.fill("#site-longitudeDeg", "10");
    await coordinator.fill("#site-elevationM", "500");
    await coordinator.fill("#site-fieldOfViewDeg2", "2");
    await coordinator.locator('[data-testid="site-form"] button[type="submit"]').click();
    await coordinator.getByText("between −90 and 90").waitFor({ timeout: 10_000 });
    await coordinator.fill("#site-latitudeDeg", "-20");
    await coordinator.locator('[data-testid="site-form"] button[type="submit"]').click();
    await coordinator.locator('[data-testid="sites-table"]').getByText(siteName).waitFor({ timeout: 15_000 });

    // Instruments of the new site: add one through the form (a refused value first), edit it, delete it.
    const code = `E2E-${siteTag}`;
    const instruments = coordinator.locator(`[data-testid="instruments-table-${code}"]`);
    await coordinator.getByRole("button", { name: `Add an instrument to ${code}` }).click();
    await coordinator.fill("#instrument-name", "E2E camera");
    await coordinator.fill("#instrument-widthDeg", "1.5");
    await coordinator.fill("#instrument-heightDeg", "95");
    await coordinator.fill("#instrument-filters", "g, r");
    await coordinator.locator('[data-testid="instrument-form"] button[type="submit"]').click();
    await coordinator.getByText("below 90°").waitFor({ timeout: 10_000 });
    await coordinator.fill("#instrument-heightDeg", "1");
    await coordinator.locator('[data-testid="instrument-form"] button[type="submit"]').click();
    await instruments.getByText("E2E camera").waitFor({ timeout: 15_000 });
    check(/1\.5°\s×\s1°/.test(await instruments.innerText()), "the new instrument's footprint is not shown as 1.5° × 1°");
    await coordinator.getByRole("button", { name: `Edit ${code} E2E camera` }).click();
    await coordinator.selectOption("#instrument-shape", "circle");
    await coordinator.fill("#instrument-radiusDeg", "0.5");
    await coordinator.locator('[data-testid="instrument-form"] button[type="submit"]').click();
    await instruments.getByText(/⌀\s1°\scircle/).waitFor({ timeout: 15_000 });
    await coordinator.getByRole("button", { name: `Delete ${code} E2E camera` }).click();
    await coordinator.getByRole("button", { name: "Delete the instrument" }).click();
    await instruments.getByText("E2E camera").waitFor({ state: "detached", timeout: 15_000 });
    await coordinator.close();
  } catch (error) {
    for (const [index, open] of context.pages().entries()) {
      await open.screenshot({ path: path.join(ctx.artifactsDir, `skymap-failure-${index}.png`), fullPage: true }).catch(() => undefined);
    }
    throw error;
  } finally {
    await close();
  }
}
