import path from "node:path";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

/**
 * Host-galaxy candidates in the browser (issue 19): a shifter uploads a 3D sky map on a candidate's page; the
 * seeded fictional catalogue is ranked into a table that sorts and searches, the best are circled on the zoomed map
 * and a click there gives the distance; a coordinator uploads a catalogue on its page.
 */
export default async function galaxiesE2E(ctx: E2EContext): Promise<void> {
  const externalId = `GALAXY-E2E-${Date.now()}`;
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
    await page.setInputFiles('[data-testid="skymap-file-input"]', path.resolve("tests/fixtures/galaxies/map3d-multiorder.fits.gz"));

    const rows = page.locator('[data-testid="galaxy-table"] tbody tr');
    await rows.first().waitFor({ timeout: 60_000 });
    const count = await rows.count();
    check(count === 100, `the galaxy table shows ${count} rows, not the 100 best`);
    const first = await rows.first().innerText();
    check(/CDG-\d{6}/.test(first), `the first row names no demo galaxy: "${first}"`);

    // Sorting by distance (click the header) puts the nearest first; clicking again the farthest.
    const distances = async () =>
      (await page.locator('[data-testid="galaxy-table"] tbody tr td:nth-child(5)').allInnerTexts()).map((t) => Number.parseFloat(t));
    await page.locator('[data-testid="galaxy-table"] thead').getByRole("button", { name: "Distance" }).click();
    const up = await distances();
    check(up.every((d, i) => i === 0 || d >= (up[i - 1] ?? 0)), `not sorted by distance ascending: ${up.slice(0, 8).join(", ")}`);
    await page.locator('[data-testid="galaxy-table"] thead').getByRole("button", { name: "Distance" }).click();
    const down = await distances();
    check(down.every((d, i) => i === 0 || d <= (down[i - 1] ?? 0)), `not sorted by distance descending: ${down.slice(0, 8).join(", ")}`);

    // Searching by a name from the table keeps only the matches.
    const name = (await rows.nth(3).locator("td").nth(1).innerText()).trim();
    await page.fill('[data-testid="galaxy-search"]', name);
    const matches = await rows.allInnerTexts();
    check(matches.length === 1 && matches[0]?.includes(name), `searching ${name} left ${matches.length} rows`);

    // The best are circled on the zoomed map.
    const marks = await page.locator('[data-testid="galaxy-mark"]').count();
    check(marks === 30, `${marks} galaxy marks on the zoomed map, not 30`);
    // A click on the zoomed map asks the distance there.
    const zoomed = page.locator('[data-testid="skymap-views"] svg[role="img"]').nth(1);
    const box = await zoomed.boundingBox();
    check(box, "no zoomed map");
    await zoomed.click({ position: { x: box.width / 2, y: box.height / 2 } });
    await page.locator('[data-testid="picked-distance"]').getByText(/[\d.,]+\s±\s[\d.,]+\sMpc|no distance in that pixel/).waitFor({ timeout: 30_000 });
    const note = await page.locator('[data-testid="galaxy-targets"]').innerText();
    check(/take precedence/.test(note), "the caution is missing beside the galaxy table");
    await page.screenshot({ path: path.join(ctx.artifactsDir, "galaxies-candidate.png"), fullPage: true });
    check(errors.length === 0, `page errors: ${errors.join("; ")}`);
    await page.close();

    // A coordinator uploads a catalogue on its page: a bad file is refused naming row and column, a good one is listed.
    await context.clearCookies();
    const coordinator = await context.newPage();
    await ctx.signIn(coordinator, "cleo@chirpdesk.test", "demo-coordinator");
    await coordinator.goto(`${ctx.baseUrl}/settings/catalogues`);
    await coordinator.locator('[data-testid="catalogues-table"]').getByText("Demo galaxies (fictional)").waitFor({ timeout: 30_000 });
    await coordinator.setInputFiles('[data-testid="catalogue-file-input"]', { name: "bad.csv", mimeType: "text/csv", buffer: Buffer.from("name,raDeg,decDeg,distanceMpc\nA,1,2,3\nB,1,95,3\n") });
    const refusal = await coordinator.locator('[data-testid="catalogue-upload-error"]').innerText({ timeout: 30_000 });
    check(/row 2 .*column decDeg/.test(refusal), `bad catalogue refusal: "${refusal}"`);
    const tag = Date.now().toString(36);
    await coordinator.fill('input[placeholder="the file name when empty"]', `E2E catalogue ${tag}`);
    await coordinator.setInputFiles('[data-testid="catalogue-file-input"]', path.resolve("tests/fixtures/galaxies/catalogue.csv"));
    const row = coordinator.locator('[data-testid="catalogues-table"] tr', { hasText: `E2E catalogue ${tag}` });
    await row.waitFor({ timeout: 60_000 });
    check((await row.innerText()).includes("3,000"), `the new catalogue row: "${await row.innerText()}"`);
    await coordinator.close();
  } catch (error) {
    for (const [index, open] of context.pages().entries()) {
      await open.screenshot({ path: path.join(ctx.artifactsDir, `galaxies-failure-${index}.png`), fullPage: true }).catch(() => undefined);
    }
    throw error;
  } finally {
    await close();
  }
}
