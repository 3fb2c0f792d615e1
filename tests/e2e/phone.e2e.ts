import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

const PHONE = { width: 390, height: 844 };

/**
 * A 390 px phone: the board and the candidate page of a black hole–neutron star pair (remnant matter, p-astro,
 * class errors) and of a one-sample track (said plainly to be unusable) have no horizontal overflow; so has the
 * coordinators' physics settings page.
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
  const browser = await ctx.launchBrowser({ viewport: PHONE });
  try {
    const page = await browser.context.newPage();
    await ctx.signIn(page, "cleo@chirpdesk.test", "demo-coordinator");
    const overflow = async (what: string) => {
      const { scroll, client, wide } = await page.evaluate(() => {
        const width = document.documentElement.clientWidth;
        // The innermost elements reaching past the right edge, to name the culprit in the failure.
        const past = [...document.querySelectorAll("body *")].filter((el) => el.getBoundingClientRect().right > width + 1 && el.children.length === 0);
        // (no named helper here: the bundler would wrap it in a function the browser does not have)
        // Also the innermost elements that are themselves wider than the screen: the one that does not shrink.
        const stretched = [...document.querySelectorAll("body *")].filter((el) => {
          if (el.getBoundingClientRect().width <= width + 1) return false;
          for (let up = el.parentElement; up && up !== document.body; up = up.parentElement) if (getComputedStyle(up).overflowX !== "visible") return false;
          return true;
        });
        const deepest = stretched.filter((el) => !stretched.some((other) => other !== el && el.contains(other)));
        const wide = [...deepest.slice(0, 3), ...past.slice(0, 3)].map((el) => `${el.tagName.toLowerCase()}.${String(el.className).slice(0, 60)} "${(el.textContent ?? "").slice(0, 40)}"`);
        return { scroll: document.documentElement.scrollWidth, client: width, wide };
      });
      check(scroll <= client, `${what}: page is ${scroll} px wide in a ${client} px viewport; past the edge: ${wide.join(" | ")}`);
    };

    await page.goto(`${ctx.baseUrl}/candidates/${String(nsbh.body.id)}`);
    await page.getByTestId("source-class").waitFor({ timeout: 20_000 });
    const classes = await page.getByTestId("source-class").innerText();
    check(/p-astro/.test(classes) && /±/.test(classes), `class panel shows p-astro and the Monte Carlo error: ${classes.slice(0, 200)}`);
    const remnant = await page.getByTestId("remnant-matter").innerText();
    check(/neutron-star radius of 12 km/.test(remnant), `remnant matter names its assumptions: ${remnant}`);
    const model = await page.getByTestId("fit-summary").innerText();
    check(/3\.5PN frequency evolution/.test(model), `fit summary names the model: ${model}`);
    const triggerRows = await page.getByTestId("trigger-row").count();
    check(triggerRows === 2, `the NSBH candidate lists both pipelines' triggers (${triggerRows} rows)`);
    await overflow("candidate page (NSBH)");
    await page.screenshot({ path: `${ctx.artifactsDir}/phone-candidate.png`, fullPage: true });
    ctx.log("the NSBH candidate page fits 390 px with model, p-astro, class errors and remnant matter");

    await page.goto(`${ctx.baseUrl}/candidates/${String(oneSample.body.id)}`);
    const said = await page.getByTestId("fit-summary").innerText();
    check(/The frequency track was unusable/.test(said), `one-sample track said plainly: ${said}`);
    await overflow("candidate page (one-sample track)");
    ctx.log("a one-sample track is said to be unusable");

    await page.goto(`${ctx.baseUrl}/triage`);
    const card = page.locator(`[data-testid=triage-card]:has-text("PX${tag}")`);
    await card.waitFor({ timeout: 20_000 });
    const status = await card.getByTestId("card-chirp-status").innerText();
    check(status.trim() === "track unusable: no chirp mass", `card chirp status: "${status}"`);
    await overflow("triage board");
    await page.screenshot({ path: `${ctx.artifactsDir}/phone-board.png` });
    ctx.log("the card says the track was unusable and the board fits 390 px");

    await page.goto(`${ctx.baseUrl}/settings/physics`);
    await page.getByTestId("physics-settings-form").waitFor({ timeout: 20_000 });
    await overflow("physics settings");
    ctx.log("the physics settings page fits 390 px");
  } finally {
    await browser.close();
  }
}
