import type { Page } from "playwright-core";
import { pagingPayload } from "@/tests/support/paging-payload";
import { check, type E2EContext } from "./types";

/**
 * Response-time review in the browser: a candidate posted and acknowledged shows in the step table, a bar click
 * lists it, a coordinator changes a deadline and the figures follow, an observer reads but cannot change
 * deadlines, the CSV carries the candidate, a shift's handoff page prints.
 */
export default async function reviewE2E(ctx: E2EContext): Promise<void> {
  const externalId = `RV-E2E-${Date.now().toString(36)}`;
  // A merger 3 minutes back: a signal of its own, clear of the seconds-old ones the browser tests before this post
  // (within ±1 s of another test's signal it would join that candidate).
  const posted = await ctx.postCandidate(pagingPayload(externalId, new Date(Date.now() - 3 * 60_000), { source: "review-e2e" }));
  check(posted.status === 201, `feed post answered ${posted.status}`);
  const candidateId = String(posted.body.id);

  const { context, close } = await ctx.launchBrowser();
  try {
    const shifter = await context.newPage();
    await ctx.signIn(shifter, "ada@chirpdesk.test", "demo-shifter");
    for (const to of ["acknowledged", "pursue"]) {
      const res = await shifter.request.post(`${ctx.baseUrl}/api/v1/candidates/${candidateId}/triage`, { data: { to, via: "api" } });
      check(res.ok(), `triage to ${to} answered ${res.status()}`);
    }
    await shifter.close();
    await context.clearCookies();

    const page = await context.newPage();
    await ctx.signIn(page, "cleo@chirpdesk.test", "demo-coordinator");
    await page.goto(`${ctx.baseUrl}/review`);
    await page.waitForSelector('[data-testid="step-table"]', { timeout: 30_000 });
    await listBehindBar(page, externalId);
    await page.keyboard.press("Escape");

    // Acknowledgement deadline to 0.5 min: the table's deadline cell follows after the save.
    // The acknowledgement's deadline is counted from receipt: paging (1 min) + the acknowledgement step.
    // (the board's warning may not come after the deadline: 1 min while the deadline is 1.5 min, then 3 min again)
    await setAcknowledgementDeadline(page, "0.5", "1 min 30 s", "1");
    await setAcknowledgementDeadline(page, "4", "5 min", "3");
    await page.screenshot({ path: `${ctx.artifactsDir}/review-coordinator.png`, fullPage: true });

    const csv = await page.request.get(`${ctx.baseUrl}/api/v1/review/export`);
    check((csv.headers()["content-type"] ?? "").startsWith("text/csv"), "CSV content type");
    check((await csv.text()).includes(externalId), "CSV lists the new candidate");

    const handoff = page.locator('a[href^="/review/handoff/"]').first();
    if ((await handoff.count()) > 0) {
      await handoff.click();
      await page.waitForSelector("text=Candidates received", { timeout: 30_000 });
      check((await page.title()).includes("Shift handoff"), `handoff page title "${await page.title()}"`);
    } else {
      ctx.log("no shift in range; handoff page not opened");
    }
    await page.close();
    await context.clearCookies();

    const observer = await context.newPage();
    await ctx.signIn(observer, "bram@chirpdesk.test", "demo-observer");
    await observer.goto(`${ctx.baseUrl}/review`);
    await observer.waitForSelector('[data-testid="step-table"]', { timeout: 30_000 });
    check((await observer.getByRole("button", { name: "Deadlines" }).count()) === 0, "observers see no deadline editor");
    const refused = await observer.request.put(`${ctx.baseUrl}/api/v1/settings/deadlines`, {
      data: { feedLatencyMinutes: 2, pageMinutes: 1, acknowledgeStepMinutes: 4, decisionMinutes: 30, claimMinutes: 60, reportMinutes: 720, acknowledgeWarnMinutes: 3, acknowledgeAlarmMinutes: 5 },
    });
    check(refused.status() === 403, `observer PUT deadlines answered ${refused.status()}`);
  } finally {
    await close();
  }
}

/** Clicks the acknowledgement histogram's bars until one lists the candidate. */
async function listBehindBar(page: Page, externalId: string): Promise<void> {
  await page.getByRole("button", { name: /^Acknowledgement/ }).click();
  const bars = page.locator('[data-testid="distribution-chart"] .recharts-bar-rectangle');
  const count = await bars.count();
  for (let i = 0; i < count; i++) {
    await bars.nth(i).click();
    const list = page.locator('[data-testid="step-candidates"]');
    await list.waitFor({ timeout: 15_000 });
    await page.waitForSelector('[data-testid="list-total"]');
    if ((await list.innerText()).includes(externalId)) return;
    await page.keyboard.press("Escape");
  }
  throw new Error(`no acknowledgement bar listed ${externalId}`);
}

async function setAcknowledgementDeadline(page: Page, minutes: string, shown: string, warnMinutes: string): Promise<void> {
  await page.getByRole("button", { name: "Deadlines" }).click();
  await page.fill("#deadline-acknowledgeWarnMinutes", warnMinutes);
  await page.fill("#deadline-acknowledgeStepMinutes", minutes);
  await page.getByRole("button", { name: "Save deadlines" }).click();
  // The acknowledgement row's deadline cell (third row, first data cell) shows the new value once the page refreshes.
  await page.waitForFunction(
    (text) => document.querySelector('[data-testid="step-table"] tbody tr:nth-child(3) td')?.textContent === text,
    shown,
    { timeout: 20_000 },
  );
}
