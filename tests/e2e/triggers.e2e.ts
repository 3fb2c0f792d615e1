import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

/**
 * One signal from two pipelines in Chromium: the board card counts the pipelines, the candidate page lists both
 * triggers with the preferred one marked, a coordinator splits one out and merges it back, a shifter sees no
 * split or merge controls.
 */
export default async function triggersE2E(ctx: E2EContext): Promise<void> {
  const tag = Date.now().toString(36).toUpperCase();
  // Its own moment: 7 minutes ago, before this run's other browser tests posted anything (they use "now").
  const eventMs = Date.now() - 7 * 60_000;
  const first = await ctx.postCandidate({
    ...candidatePayload({ externalId: `GA${tag}`, eventTime: new Date(eventMs), falseAlarmRatePerYear: 0.3 }),
    source: "e2e-pipe-a",
  });
  const second = await ctx.postCandidate({
    ...candidatePayload({ externalId: `GB${tag}`, eventTime: new Date(eventMs + 200), falseAlarmRatePerYear: 0.002 }),
    source: "e2e-pipe-b",
  });
  check(first.status === 201 && second.status === 201, `posts answered ${first.status}, ${second.status}`);
  check(second.body.outcome === "joined" && second.body.id === first.body.id, `second trigger: ${JSON.stringify(second.body).slice(0, 200)}`);
  const candidateId = String(first.body.id);

  const coordinator = await ctx.launchBrowser({ viewport: { width: 1440, height: 1000 } });
  const shifter = await ctx.launchBrowser({ viewport: { width: 1440, height: 1000 } });
  try {
    const page = await coordinator.context.newPage();
    await ctx.signIn(page, "cleo@chirpdesk.test", "demo-coordinator");
    await page.goto(`${ctx.baseUrl}/triage`);
    const card = page.locator(`[data-testid=triage-card]:has-text("GB${tag}")`);
    await card.waitFor({ timeout: 20_000 });
    const count = await card.getByTestId("pipeline-count").innerText();
    check(count.trim() === "2 pipelines", `card pipeline count: "${count}"`);
    ctx.log("the card counts two pipelines");
    await card.screenshot({ path: `${ctx.artifactsDir}/triggers-card.png` });

    await page.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    const rows = page.locator("[data-testid=trigger-row]");
    await rows.nth(1).waitFor({ timeout: 20_000 });
    check((await rows.count()) === 2, "two trigger rows");
    const preferred = await page.locator("[data-testid=trigger-row][data-preferred=true]").innerText();
    check(preferred.includes("e2e-pipe-b"), `preferred row: ${preferred}`);
    ctx.log("the page lists both triggers, the lower false-alarm rate preferred");
    await page.locator("[data-testid=triggers-panel]").screenshot({ path: `${ctx.artifactsDir}/triggers-panel.png` });

    await page.getByRole("button", { name: `Split e2e-pipe-a GA${tag} out` }).click();
    await page.waitForFunction(() => document.querySelectorAll("[data-testid=trigger-row]").length === 1, undefined, { timeout: 20_000 });
    await page.getByText("Split 1 trigger out into a candidate of its own").waitFor({ timeout: 20_000 });
    ctx.log("split out, and the audit log says so");

    const option = page.locator("[data-testid=merge-select] option", { hasText: `GA${tag}` });
    await option.waitFor({ state: "attached", timeout: 20_000 });
    await page.selectOption("[data-testid=merge-select]", (await option.getAttribute("value")) ?? "");
    await page.getByRole("button", { name: "Merge here" }).click();
    await page.waitForFunction(() => document.querySelectorAll("[data-testid=trigger-row]").length === 2, undefined, { timeout: 20_000 });
    ctx.log("merged back");

    await page.goto(`${ctx.baseUrl}/settings`);
    await page.locator("#grouping-window").waitFor({ timeout: 20_000 });
    // react-hook-form fills registered inputs from defaultValues after hydration, not in the server HTML: wait for it.
    const windowShown = await page
      .waitForFunction(() => (document.querySelector("#grouping-window") as HTMLInputElement | null)?.value === "1000", undefined, { timeout: 20_000 })
      .then(() => true, () => false);
    check(windowShown, "the grouping form shows the ±1000 ms default");
    await page.locator("form:has(#grouping-window)").screenshot({ path: `${ctx.artifactsDir}/triggers-settings.png` });
    ctx.log("a coordinator sees the grouping settings");

    const other = await shifter.context.newPage();
    await ctx.signIn(other, "ada@chirpdesk.test", "demo-shifter");
    await other.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    await other.locator("[data-testid=trigger-row]").nth(1).waitFor({ timeout: 20_000 });
    check((await other.getByRole("button", { name: /Split .* out/ }).count()) === 0, "a shifter sees no split button");
    check((await other.locator("[data-testid=merge-select]").count()) === 0, "a shifter sees no merge form");
    ctx.log("a shifter sees the table without the controls");
    await other.goto(`${ctx.baseUrl}/settings`);
    await other.getByText("API tokens").waitFor({ timeout: 20_000 });
    check((await other.locator("#grouping-window").count()) === 0, "a shifter was offered the grouping settings");
  } catch (error) {
    await coordinator.context.pages()[0]?.screenshot({ path: `${ctx.artifactsDir}/triggers-coordinator.png`, fullPage: true }).catch(() => undefined);
    throw error;
  } finally {
    await coordinator.close();
    await shifter.close();
  }
}
