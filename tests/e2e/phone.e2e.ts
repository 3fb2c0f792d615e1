import { readFileSync } from "node:fs";
import { multipartFile } from "@/fakes/feed/poster";
import { signFeedBody } from "@/lib/feed/signature";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { overflowProblem, unitBreakProblem } from "./layout-checks";
import { check, type E2EContext } from "./types";

const PHONE = { width: 390, height: 844 };
const DESKTOP = { width: 1366, height: 900 };

/**
 * A 390 px phone: every desk page has no horizontal overflow and keeps numbers with their units (and clock times
 * with their zones) on one line; the candidate page of a black hole–neutron star pair with a sky map (remnant
 * matter, p-astro, class errors, per-site visibility) and of a one-sample track (said plainly to be unusable) are
 * among them. The board and the candidate page are checked for split units at 1366 px as well.
 */
export default async function phoneE2E(ctx: E2EContext): Promise<void> {
  const tag = Date.now().toString(36).toUpperCase();
  const nsbhTime = new Date();
  const nsbh = await ctx.postCandidate(candidatePayload({ externalId: `PH${tag}`, mass1: 6, mass2: 1.4, trackSeconds: 2, eventTime: nsbhTime }));
  // An hour earlier, so the grouping never joins it to the NSBH candidate.
  const oneSample = await ctx.postCandidate({
    ...candidatePayload({ externalId: `PX${tag}`, eventTime: new Date(nsbhTime.getTime() - 3_600_000) }),
    frequencyTrack: { t: [-1], f: [80] },
  });
  // A second pipeline's trigger of the same signal joins the NSBH candidate, so its page shows the triggers table
  // with a difference column and a split action (the widest table on the page).
  const second = await ctx.postCandidate({
    ...candidatePayload({ externalId: `PS${tag}`, mass1: 6.2, mass2: 1.35, trackSeconds: 2, eventTime: nsbhTime }),
    source: "second-pipe",
  });
  check(second.status === 201 || second.status === 200, `second trigger answered ${second.status}`);
  check(nsbh.status === 201 && oneSample.status === 201, `posts answered ${nsbh.status}, ${oneSample.status}`);
  // One of the dev feed's demo sky maps, through the feed's own sky-map route: the page then has the sky-map panel
  // and the per-site visibility table.
  const mapName = "demo-compact-n128.fits.gz";
  const { body, contentType } = await multipartFile(mapName, new Uint8Array(readFileSync(`fakes/feed/skymaps/${mapName}`)));
  const mapRes = await fetch(`${ctx.baseUrl}/api/v1/feed/candidates/test-pipe/PH${tag}/skymap`, {
    method: "POST",
    headers: { "content-type": contentType, ...signFeedBody(ctx.env.FEED_SIGNING_SECRET ?? "", body, Date.now()) },
    body,
  });
  check(mapRes.status === 201, `sky map upload answered ${mapRes.status}: ${await mapRes.text()}`);

  const browser = await ctx.launchBrowser({ viewport: PHONE });
  const admin = await ctx.launchBrowser({ viewport: PHONE });
  const desktop = await ctx.launchBrowser({ viewport: DESKTOP });
  // Every page is checked before the test fails, so one run names every problem.
  const problems: string[] = [];
  const note = (problem: string | null) => {
    if (problem) problems.push(problem);
  };
  try {
    const page = await browser.context.newPage();
    await ctx.signIn(page, "cleo@chirpdesk.test", "demo-coordinator");
    const fits = async (what: string) => {
      note(await overflowProblem(page, what));
      note(await unitBreakProblem(page, `${what} at 390 px`));
    };

    await page.goto(`${ctx.baseUrl}/candidates/${String(nsbh.body.id)}`);
    await page.getByTestId("source-class").waitFor({ timeout: 20_000 });
    const classes = await page.getByTestId("source-class").innerText();
    check(/p-astro/.test(classes) && /±/.test(classes), `class panel shows p-astro and the Monte Carlo error: ${classes.slice(0, 200)}`);
    const remnant = await page.getByTestId("remnant-matter").innerText();
    check(/neutron-star radius of 12\u00a0km/.test(remnant), `remnant matter names its assumptions: ${remnant}`);
    const model = await page.getByTestId("fit-summary").innerText();
    check(/3\.5PN frequency evolution/.test(model), `fit summary names the model: ${model}`);
    const triggerRows = await page.getByTestId("trigger-row").count();
    check(triggerRows === 2, `the NSBH candidate lists both pipelines' triggers (${triggerRows} rows)`);
    await page.getByTestId("visibility-table").waitFor({ timeout: 30_000 });
    await fits("candidate page (NSBH, sky map)");
    await page.screenshot({ path: `${ctx.artifactsDir}/phone-candidate.png`, fullPage: true });
    ctx.log("the NSBH candidate page with its sky map fits 390 px with model, p-astro, class errors and remnant matter");

    await page.goto(`${ctx.baseUrl}/candidates/${String(oneSample.body.id)}`);
    const said = await page.getByTestId("fit-summary").innerText();
    check(/The frequency track was unusable/.test(said), `one-sample track said plainly: ${said}`);
    await fits("candidate page (one-sample track)");
    ctx.log("a one-sample track is said to be unusable");

    await page.goto(`${ctx.baseUrl}/triage`);
    const card = page.locator(`[data-testid=triage-card]:has-text("PX${tag}")`);
    await card.waitFor({ timeout: 20_000 });
    const status = await card.getByTestId("card-chirp-status").innerText();
    check(status.trim() === "track unusable: no chirp mass", `card chirp status: "${status}"`);
    await fits("triage board");
    await page.screenshot({ path: `${ctx.artifactsDir}/phone-board.png` });
    ctx.log("the card says the track was unusable and the board fits 390 px");

    // A new candidate's toast, on a phone in the dark theme: dark like the desk, at the bottom, clear of the title.
    await page.locator('[data-testid=live-status][data-status=live]').waitFor({ state: "attached", timeout: 15_000 });
    const toastAt = new Date(nsbhTime.getTime() - 2 * 3_600_000);
    const live = await ctx.postCandidate(candidatePayload({ externalId: `PT${tag}`, eventTime: toastAt }));
    check(live.status === 201, `toast candidate answered ${live.status}`);
    const toast = page.locator("[data-sonner-toast]").filter({ hasText: `PT${tag}` });
    await toast.waitFor({ timeout: 20_000 });
    const look = await page.evaluate(() => {
      const toaster = document.querySelector("[data-sonner-toaster]");
      const title = document.querySelector("main h1")?.getBoundingClientRect();
      const box = [...document.querySelectorAll("[data-sonner-toast]")].at(-1)?.getBoundingClientRect();
      return {
        theme: toaster?.getAttribute("data-sonner-theme"),
        y: toaster?.getAttribute("data-y-position"),
        overlapsTitle: !!title && !!box && box.top < title.bottom && box.bottom > title.top,
        dark: document.documentElement.classList.contains("dark"),
      };
    });
    check(look.dark && look.theme === "dark", `toast theme ${look.theme ?? "none"} on a ${look.dark ? "dark" : "light"} desk`);
    check(look.y === "bottom" && !look.overlapsTitle, `toast at ${look.y ?? "?"}, over the title: ${look.overlapsTitle}`);
    ctx.log("on a phone the toast is dark like the desk and sits at the bottom, clear of the title");

    // Every other desk page a coordinator sees, each once it has drawn its main content.
    const pages = ["/candidates", "/follow-up", "/review", "/rota", "/sites", "/notifications", "/notifications/preferences", "/settings", "/settings/physics", "/dead-letters"];
    for (const path of pages) {
      const res = await page.goto(`${ctx.baseUrl}${path}`);
      check(res?.status() === 200, `${path} answered ${res?.status() ?? "nothing"}`);
      await page.locator("main h1").first().waitFor({ timeout: 20_000 });
      await page.waitForLoadState("networkidle").catch(() => undefined);
      await fits(path);
      // Native date and time pickers follow the browser's locale (12-hour in en-US): the app's inputs are 24-hour ISO text.
      const native = await page.locator("input[type=date], input[type=time], input[type=datetime-local]").count();
      if (native > 0) problems.push(`${path}: ${native} native date/time input(s) that would show the browser's 12-hour format`);
    }
    await page.goto(`${ctx.baseUrl}/review`);
    const handoff = await page.locator('a[href^="/review/handoff/"]').first().getAttribute("href").catch(() => null);
    check(handoff, "the review links a shift's handoff");
    await page.goto(`${ctx.baseUrl}${handoff}`);
    await page.locator("main h1").first().waitFor({ timeout: 20_000 });
    await fits("handoff");
    ctx.log(`${pages.length + 1} more desk pages checked at 390 px`);

    const adminPage = await admin.context.newPage();
    await ctx.signIn(adminPage, "dara@chirpdesk.test", "demo-admin");
    await adminPage.goto(`${ctx.baseUrl}/admin/users`);
    await adminPage.locator("main h1").first().waitFor({ timeout: 20_000 });
    note(await overflowProblem(adminPage, "/admin/users"));
    note(await unitBreakProblem(adminPage, "/admin/users at 390 px"));
    ctx.log("the people page checked at 390 px");

    const wide = await desktop.context.newPage();
    await ctx.signIn(wide, "ada@chirpdesk.test", "demo-shifter");
    await wide.goto(`${ctx.baseUrl}/triage`);
    await wide.locator(`[data-testid=triage-card]:has-text("PH${tag}")`).waitFor({ timeout: 20_000 });
    note(await unitBreakProblem(wide, "triage board at 1366 px"));
    await wide.goto(`${ctx.baseUrl}/candidates/${String(nsbh.body.id)}`);
    await wide.getByTestId("source-class").waitFor({ timeout: 20_000 });
    note(await unitBreakProblem(wide, "candidate page at 1366 px"));
    check(problems.length === 0, `${problems.length} layout problem(s):\n${problems.join("\n")}`);
    ctx.log("at 1366 px the board and the candidate page keep every number with its unit");
  } finally {
    await browser.close();
    await admin.close();
    await desktop.close();
  }
}
