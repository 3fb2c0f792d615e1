import { readFileSync } from "node:fs";
import path from "node:path";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { planCsvColumns } from "@/lib/plans/export";
import { check, type E2EContext } from "./types";

/**
 * Pointing plans in the browser (issue 17): a shifter uploads a sky map on a fresh candidate, plans pointings for
 * one site's instrument from the candidate page, sees the tiles outlined on both sky views (numbered in the zoomed
 * one, with the site in the legend) and downloads the plan as CSV with our columns.
 */
export default async function plansE2E(ctx: E2EContext): Promise<void> {
  const externalId = `PLANS-E2E-${Date.now()}`;
  const posted = await ctx.postCandidate(candidatePayload({ externalId, eventTime: new Date() }));
  check(posted.status === 201, `posting the candidate answered ${posted.status}`);
  const candidateId = String(posted.body.id);

  const { context, close } = await ctx.launchBrowser({ viewport: { width: 1280, height: 1000 } });
  try {
    const page = await context.newPage();
    const errors: string[] = [];
    page.on("pageerror", (e) => errors.push(e.message));
    await ctx.signIn(page, "ada@chirpdesk.test", "demo-shifter");
    await page.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    await page.getByText("No sky map yet").waitFor({ timeout: 30_000 });
    await page.setInputFiles('[data-testid="skymap-file-input"]', path.resolve("tests/fixtures/skymap", "bimodal-multiorder.fits.gz"));
    await page.waitForSelector('[data-testid="area90"]', { timeout: 30_000 });

    const panel = page.locator('[data-testid="candidate-plans"]');
    await panel.getByText("No pointing plans yet.").waitFor({ timeout: 30_000 });
    const instrument = panel.getByLabel("Instrument");
    const options = await instrument.locator("option").allTextContents();
    const wide = options.find((o) => o.startsWith("KRN")) ?? options[0];
    check(wide, `no instrument to plan with: ${options.join(" | ")}`);
    await instrument.selectOption({ label: wide });
    await panel.getByLabel("At most pointings").fill("8");
    await panel.getByRole("button", { name: "Plan pointings" }).click();
    const row = panel.locator('[data-testid="plan-row"]').first();
    await row.waitFor({ timeout: 60_000 });
    const rowText = await row.innerText();
    check(/8 pointings/.test(rowText), `plan row: "${rowText}"`);

    // The tiles on both views: 8 outlines each, numbers 1–8 in the zoomed view only, the site in the legend.
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="plan-footprints"]').length === 2, undefined, { timeout: 30_000 });
    const outlines = await page.locator('[data-testid="plan-footprints"] path').count();
    check(outlines === 16, `expected 8 outlines on each of the two views, saw ${outlines}`);
    const numbers = (await page.locator('[data-testid="footprint-number"]').allTextContents()).map(Number).sort((a, b) => a - b);
    check(numbers.join(",") === "1,2,3,4,5,6,7,8", `numbers in the zoomed view: ${numbers.join(",")}`);
    const legend = await page.locator('[data-testid="planned-legend"]').innerText();
    check(legend.includes(wide.slice(0, 3)), `legend does not name the site: "${legend}"`);

    // CSV download with our columns, one row per pointing.
    const [download] = await Promise.all([page.waitForEvent("download"), row.locator('[data-testid="plan-export-csv"]').click()]);
    const file = await download.path();
    check(file, "the CSV download has no file");
    const lines = readFileSync(file, "utf8").trimEnd().split("\r\n");
    check(lines[0] === planCsvColumns.join(","), `CSV header: ${lines[0]}`);
    check(lines.length === 9, `CSV has ${lines.length - 1} rows, expected 8`);
    check(/^plan-KRN-/.test(download.suggestedFilename()) || wide.slice(0, 3) !== "KRN", `file name ${download.suggestedFilename()}`);
    check(errors.length === 0, `page errors: ${errors.join("; ")}`);
    ctx.log(`planned 8 tiles with ${wide}; CSV ${download.suggestedFilename()}`);

    // A task for the observer's site with a plan attached (through the API, as the shifter).
    const api = async (method: string, url: string, data?: unknown) => {
      const res = await page.request.fetch(`${ctx.baseUrl}${url}`, { method, data, headers: { origin: ctx.baseUrl } });
      return { status: res.status(), body: (await res.json()) as Record<string, unknown> };
    };
    check((await api("POST", `/api/v1/candidates/${candidateId}/triage`, { to: "pursue" })).status === 200, "moving the candidate to Pursue failed");
    const site = ((await api("GET", "/api/v1/sites")).body.sites as Array<{ id: string; code: string }>).find((s) => s.code === "KRN");
    check(site, "the demo site KRN is missing");
    const made = await api("POST", `/api/v1/candidates/${candidateId}/tasks`, { tasks: [{ kind: "wide-field-tiling", siteId: site.id, priority: 2, notes: "" }] });
    const taskId = String((made.body.tasks as Array<{ id: string }>)[0]?.id);
    const instrumentId = ((await api("GET", `/api/v1/sites/${site.id}/instruments`)).body.instruments as Array<{ id: string }>)[0]?.id;
    const planned = await api("POST", `/api/v1/candidates/${candidateId}/plans`, { instrumentId, taskId, maxPointings: 5, avoid: "none" });
    check(planned.status === 201, `planning for the task answered ${planned.status}: ${JSON.stringify(planned.body)}`);
  } finally {
    await close();
  }
  await observerOnPhone(ctx, externalId);
}

/** The KRN observer reads the task's pointings on a 390 px phone and ticks the first one done; it stays ticked. */
async function observerOnPhone(ctx: E2EContext, externalId: string): Promise<void> {
  const { context, close } = await ctx.launchBrowser({ viewport: { width: 390, height: 844 } });
  try {
    const page = await context.newPage();
    await ctx.signIn(page, "bram@chirpdesk.test", "demo-observer");
    await page.goto(`${ctx.baseUrl}/follow-up?candidate=${externalId}`);
    const card = page.locator('[data-testid="task-card"]').first();
    await card.waitFor({ timeout: 30_000 });
    const summary = await card.locator('[data-testid="task-plan-summary"]').innerText();
    check(/5 pointings · \d+ % scheduled/.test(summary), `task card plan summary: "${summary}"`);
    await card.locator('[data-testid="task-plan-summary"] a').click();
    await page.waitForSelector('[data-testid="plan-pointing"]', { timeout: 30_000 });
    const rows = await page.locator('[data-testid="plan-pointing"]').count();
    check(rows === 5, `the task view lists ${rows} pointings, expected 5`);
    const width = await page.evaluate(() => document.documentElement.scrollWidth);
    check(width <= 390, `the task view is ${width} px wide at 390 px`);
    const first = page.locator('[data-testid="plan-pointing"] input[type="checkbox"]').first();
    const name = (await first.getAttribute("aria-label")) ?? "";
    await first.check({ force: true });
    await page.waitForFunction(() => document.querySelector<HTMLInputElement>('[data-testid="plan-pointing"] input[type="checkbox"]')?.checked === true, undefined, { timeout: 15_000 });
    await page.waitForTimeout(1000);
    await page.reload();
    await page.waitForSelector('[data-testid="plan-pointing"]', { timeout: 30_000 });
    check(await page.getByLabel(name).isChecked(), `${name} is not ticked after a reload`);
    ctx.log(`the observer ticked "${name}" at 390 px (page ${width} px wide)`);
  } finally {
    await close();
  }
}
