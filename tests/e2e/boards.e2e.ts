import type { Locator, Page } from "playwright-core";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

/**
 * Triage board in Chromium: drag a card with the mouse and with the keyboard, see both persist after a reload,
 * watch a second browser pick the changes up live, and dismiss through the card's menu.
 */
export default async function boardsE2E(ctx: E2EContext): Promise<void> {
  const tag = Date.now().toString(36).toUpperCase();
  const names = { mouse: `EM${tag}`, keys: `EK${tag}`, menu: `EN${tag}`, pursue: `EP${tag}`, tap: `ET${tag}` };
  for (const [i, externalId] of Object.values(names).entries()) {
    // Five signals, not one: event times 5 s apart, outside the ±1 s window that groups triggers.
    const res = await ctx.postCandidate(candidatePayload({ externalId, eventTime: new Date(Date.now() - i * 5_000) }));
    check(res.status === 201, `feed post for ${externalId} answered ${res.status}: ${JSON.stringify(res.body)}`);
  }

  const shifter = await ctx.launchBrowser();
  const watcher = await ctx.launchBrowser();
  try {
    const page = await shifter.context.newPage();
    await ctx.signIn(page, "ada@chirpdesk.test", "demo-shifter");
    await openBoard(page, ctx.baseUrl);
    const other = await watcher.context.newPage();
    await ctx.signIn(other, "cleo@chirpdesk.test", "demo-coordinator");
    await openBoard(other, ctx.baseUrl);
    await other.locator('[data-testid=live-status][data-status=live]').waitFor({ timeout: 15_000 });

    // Mouse: Incoming → Taken.
    const mouseCard = card(page, names.mouse);
    await mouseCard.waitFor();
    check((await columnOf(mouseCard)) === "new", "a fresh candidate starts in New");
    await dragWithMouse(page, mouseCard.getByTestId("card-handle"), page.locator('[data-column="acknowledged"]'));
    await card(page, names.mouse, "acknowledged").waitFor({ timeout: 10_000 });
    ctx.log("mouse drag moved the card to Taken");
    await card(other, names.mouse, "acknowledged").waitFor({ timeout: 15_000 });
    ctx.log("the second browser saw it live");

    // One tap: the card's own Acknowledge button; the card then says who acknowledged it.
    await card(page, names.tap).getByTestId("card-acknowledge").click();
    const tapped = card(page, names.tap, "acknowledged");
    await tapped.getByTestId("acknowledged-by").filter({ hasText: "Ada Quill" }).waitFor({ timeout: 15_000 });
    await expectFocusOn(page, "data-card-id", names.tap, "acknowledged", "after the card's Acknowledge button");
    ctx.log("one tap acknowledged a card, which names Ada Quill as the one who did");

    // Keyboard: Incoming → (Taken) → In review, with spoken announcements.
    const keyHandle = card(page, names.keys).getByTestId("card-handle");
    // dnd-kit's keyboard sensor starts listening for arrow keys one task after the pick-up (a setTimeout in its
    // attach()), so each key waits for the announcement of the step before it, as a screen-reader user would.
    const liveRegion = page.locator('[id^="DndLiveRegion"]');
    const heard = async (pattern: RegExp) => {
      try {
        await page.waitForFunction((source) => new RegExp(source).test(document.querySelector('[id^="DndLiveRegion"]')?.textContent ?? ""), pattern.source, {
          timeout: 10_000,
        });
      } catch {
        throw new Error(`the board never announced ${pattern}; last heard “${(await liveRegion.textContent()) ?? ""}”`);
      }
    };
    await keyHandle.focus();
    check(await keyHandle.evaluate((el) => el === document.activeElement), "the card's move handle takes keyboard focus");
    await page.keyboard.press("Space");
    await heard(new RegExp(`Picked up candidate ${names.keys}|candidate ${names.keys} is over column Incoming`));
    await page.evaluate(() => new Promise((resolve) => setTimeout(resolve, 50)));
    await page.keyboard.press("ArrowRight");
    await heard(/is over column Taken/);
    await page.keyboard.press("ArrowRight");
    await heard(/is over column In review/);
    await page.keyboard.press("Space");
    await card(page, names.keys, "reviewing").waitFor({ timeout: 10_000 });
    const spoken = (await liveRegion.textContent()) ?? "";
    check(/dropped on column In review/.test(spoken), `the drop was announced; heard “${spoken}”`);
    ctx.log("keyboard drag moved the card to In review and was announced");
    await expectFocusOn(page, "data-card-id", names.keys, "reviewing", "after a keyboard drop");
    // Focus is usable, not just present: Space picks the same card up again, Escape puts it back.
    await page.keyboard.press("Space");
    await heard(new RegExp(`Picked up candidate ${names.keys}|candidate ${names.keys} is over column In review`));
    await page.evaluate(() => new Promise((resolve) => setTimeout(resolve, 50)));
    await page.keyboard.press("Escape");
    await expectFocusOn(page, "data-card-id", names.keys, "reviewing", "after a cancelled keyboard drag");
    ctx.log("focus stayed on the moved card after the keyboard drop");
    await card(other, names.keys, "reviewing").waitFor({ timeout: 15_000 });

    // The button equivalent: ⋯ → Dismissed → reason.
    await card(page, names.menu).getByTestId("card-actions").click();
    await page.getByRole("dialog").getByRole("button", { name: "Dismissed" }).click();
    await page.locator("#dismiss-reason").fill("scattered light in N1");
    await page.getByRole("dialog").getByRole("button", { name: "Dismiss" }).click();
    await card(page, names.menu, "dismissed").waitFor({ timeout: 10_000 });
    await expectFocusOn(page, "data-card-id", names.menu, "dismissed", "after a dismissal from the card menu");
    ctx.log("the card menu dismissed a candidate with a reason; focus followed the card");

    // Everything persists across a reload.
    await page.reload();
    await openBoard(page, ctx.baseUrl, false);
    await card(page, names.mouse, "acknowledged").waitFor();
    await card(page, names.keys, "reviewing").waitFor();
    await card(page, names.menu, "dismissed").waitFor();
    ctx.log("all three moves persisted after a reload");

    // Pursue opens the planning form; an observer claims the new task by dragging it, then reports.
    await card(page, names.pursue).getByTestId("card-actions").click();
    await page.getByRole("dialog").getByRole("button", { name: "Pursue" }).click();
    const plan = page.getByRole("dialog");
    await plan.locator("#task-0-kind").selectOption("spectroscopy");
    await plan.locator("#task-0-site").selectOption("any");
    await plan.locator("#task-0-notes").fill("slit on the brightest host candidate");
    await plan.getByRole("button", { name: /Pursue and create 1 task/ }).click();
    await card(page, names.pursue, "pursue").waitFor({ timeout: 10_000 });
    ctx.log("the planning form moved the candidate to Pursue with one task");

    const observer = await ctx.launchBrowser();
    try {
      const obs = await observer.context.newPage();
      await ctx.signIn(obs, "bram@chirpdesk.test", "demo-observer");
      await obs.goto(`${ctx.baseUrl}/follow-up?candidate=${names.pursue}`);
      const task = obs.getByTestId("task-card").filter({ hasText: names.pursue });
      await task.waitFor({ timeout: 15_000 });
      check((await columnOf(task)) === "open", "the new task starts open");
      await dragWithMouse(obs, task.getByRole("button", { name: /^Move / }), obs.locator('[data-column="claimed"]'));
      const claimed = obs.locator('[data-column="claimed"]').getByTestId("task-card").filter({ hasText: names.pursue });
      await claimed.filter({ hasText: "Bram Osei" }).waitFor({ timeout: 10_000 });
      ctx.log("the observer claimed the task by dragging it");
      await claimed.getByRole("button", { name: "Start observing" }).focus();
      await obs.keyboard.press("Enter");
      const observing = obs.locator('[data-column="observing"]').getByTestId("task-card").filter({ hasText: names.pursue });
      await observing.waitFor({ timeout: 10_000 });
      await expectFocusOn(obs, "data-task-id", names.pursue, "observing", "after Start observing from the keyboard");
      await observing.getByRole("button", { name: "Report" }).click();
      await obs.locator("#task-text").fill("no new point source in the slit");
      await obs.getByRole("dialog").getByRole("button", { name: "Report" }).click();
      await obs.locator('[data-column="reported"]').getByTestId("task-card").filter({ hasText: "no new point source" }).waitFor({ timeout: 10_000 });
      ctx.log("the observer started observing and reported a result");
    } finally {
      await observer.close();
    }
  } catch (error) {
    for (const [name, browser] of [["shifter", shifter], ["watcher", watcher]] as const) {
      for (const [index, open] of browser.context.pages().entries()) {
        await open.screenshot({ path: `${ctx.artifactsDir}/boards-${name}-${index}.png`, fullPage: true }).catch(() => undefined);
      }
    }
    throw error;
  } finally {
    await shifter.close();
    await watcher.close();
  }
}

/** Waits (up to 5 s) for keyboard focus to be inside the card that holds `name`, in `column`. */
async function expectFocusOn(page: Page, attribute: "data-card-id" | "data-task-id", name: string, column: string, when: string): Promise<void> {
  const where = () =>
    page.evaluate((attr) => {
      const active = document.activeElement;
      const holder = active?.closest(`[${attr}]`);
      return {
        tag: active ? `${active.tagName.toLowerCase()}${active.getAttribute("aria-label") ? ` “${active.getAttribute("aria-label")}”` : ""}` : "nothing",
        text: holder?.textContent ?? "",
        column: holder?.closest("[data-column]")?.getAttribute("data-column") ?? null,
      };
    }, attribute);
  const deadline = Date.now() + 5_000;
  let seen = await where();
  while (!(seen.column === column && seen.text.includes(name)) && Date.now() < deadline) {
    await page.waitForTimeout(100);
    seen = await where();
  }
  check(seen.column === column && seen.text.includes(name), `${when}, focus should be on ${name} in ${column}; it is on ${seen.tag} (card column ${seen.column ?? "none"})`);
}

async function openBoard(page: Page, baseUrl: string, navigate = true): Promise<void> {
  if (navigate) await page.goto(`${baseUrl}/triage`);
  await page.locator('[data-testid=triage-board][data-board-ready="true"]').waitFor({ timeout: 30_000 });
}

function card(page: Page, externalId: string, column?: string): Locator {
  const scope = column ? page.locator(`[data-column="${column}"]`) : page;
  return scope.getByTestId("triage-card").filter({ has: page.getByRole("link", { name: externalId, exact: true }) });
}

async function columnOf(locator: Locator): Promise<string | null> {
  return locator.evaluate((el) => el.closest("[data-column]")?.getAttribute("data-column") ?? null);
}

async function dragWithMouse(page: Page, handle: Locator, target: Locator): Promise<void> {
  await handle.scrollIntoViewIfNeeded();
  const from = await handle.boundingBox();
  const to = await target.boundingBox();
  check(from && to, "drag source and target are on screen");
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  // Past the 5 px activation distance first, then across in steps so dnd-kit sees the pointer travel.
  await page.mouse.move(from.x + from.width / 2 + 12, from.y + from.height / 2 + 4, { steps: 4 });
  await page.mouse.move(to.x + to.width / 2, to.y + 120, { steps: 12 });
  await page.mouse.up();
}
