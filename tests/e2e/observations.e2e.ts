import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import type { Page } from "playwright-core";
import { candidatePayload } from "@/tests/support/candidate-payload";
import { check, type E2EContext } from "./types";

const PHONE = { width: 390, height: 844 };
const fixture = (name: string) => path.resolve("tests/fixtures/skymap", name);

/** JSON from the app's API in the signed-in page (its session cookie, same origin). */
async function api<T>(page: Page, url: string, init: { method?: string; json?: unknown } = {}): Promise<{ status: number; body: T }> {
  return page.evaluate(
    async ({ url, method, json }) => {
      const res = await fetch(url, { method: method ?? "GET", headers: json === undefined ? {} : { "content-type": "application/json" }, body: json === undefined ? undefined : JSON.stringify(json) });
      return { status: res.status, body: (await res.json()) as T };
    },
    { url, method: init.method, json: init.json },
  );
}

const percentShown = async (page: Page) => Number.parseFloat((await page.getByTestId("covered-probability").innerText()).replace(/[^\d.]/g, "") || "0");

/**
 * On a 390 px phone: a pursued candidate with a sky map and a task; a CSV log with a bad row is refused and stores
 * nothing; the good log uploads with progress, and the "Observed so far" figure rises without a reload; the page
 * still fits the screen.
 */
export default async function observationsE2E(ctx: E2EContext): Promise<void> {
  const tag = Date.now().toString(36).toUpperCase();
  const merger = new Date(Date.now() - 20 * 60_000);
  const posted = await ctx.postCandidate(candidatePayload({ externalId: `OB${tag}`, eventTime: merger }));
  check(posted.status === 201, `posting the candidate answered ${posted.status}`);
  const candidateId = String(posted.body.id);
  const work = mkdtempSync(path.join(tmpdir(), "chirpdesk-obs-e2e-"));

  const { context, close } = await ctx.launchBrowser({ viewport: PHONE });
  try {
    const page = await context.newPage();
    await ctx.signIn(page, "cleo@chirpdesk.test", "demo-coordinator");
    await page.goto(`${ctx.baseUrl}/candidates/${candidateId}`);
    check((await api(page, `/api/v1/candidates/${candidateId}/triage`, { method: "POST", json: { to: "pursue" } })).status === 200, "moving to pursue failed");
    const sites = (await api<{ sites: Array<{ id: string; code: string }> }>(page, "/api/v1/sites")).body.sites;
    // An instrument of this run's own at the first demo site (the seed's sites may carry none).
    const siteId = sites[0]?.id;
    check(siteId, "no demo site");
    const camera = await api<{ instrument: { id: string } }>(page, `/api/v1/sites/${siteId}/instruments`, {
      method: "POST",
      json: { name: `Phone test camera ${tag}`, footprint: { shape: "rectangle", widthDeg: 4, heightDeg: 4 }, filters: ["r"], exposureS: 60, overheadS: 10 },
    });
    check(camera.status === 201, `creating the instrument answered ${camera.status}`);
    const instrumentId = camera.body.instrument.id;
    const made = await api<{ tasks: Array<{ id: string }> }>(page, `/api/v1/candidates/${candidateId}/tasks`, { method: "POST", json: { tasks: [{ kind: "wide-field-tiling", siteId }] } });
    check(made.status === 201 || made.status === 200, `planning the task answered ${made.status}`);
    const taskId = made.body.tasks[0]?.id;
    check(taskId, "no task id");

    await page.reload();
    await page.setInputFiles('[data-testid="skymap-file-input"]', fixture("bimodal-multiorder.fits.gz"));
    await page.getByTestId("covered-probability").waitFor({ timeout: 60_000 });
    check((await percentShown(page)) === 0, "coverage should start at 0 %");
    const peak = (await api<{ skymaps: Array<{ peak: { raDeg: number; decDeg: number } }> }>(page, `/api/v1/candidates/${candidateId}/skymaps`)).body.skymaps[0]?.peak;
    check(peak, "no sky map peak");

    const start = (k: number) => new Date(merger.getTime() + (5 + k) * 60_000).toISOString();
    const header = "ra_deg,dec_deg,start_utc,exposure_s,filter,instrument_id";
    const rows = [-1, 0, 1].flatMap((i) => [-1, 0, 1].map((j) => [peak.raDeg + 4 * i, peak.decDeg + 4 * j]));
    const good = [header, ...rows.map(([ra, dec], k) => `${(((ra ?? 0) % 360) + 360) % 360},${dec},${start(k)},60,r,${instrumentId}`)].join("\n");
    const bad = [header, `${peak.raDeg},${peak.decDeg},${start(0)},60,r,${instrumentId}`, `${peak.raDeg},95,${start(1)},60,r,${instrumentId}`].join("\n");
    writeFileSync(path.join(work, "bad.csv"), bad);
    writeFileSync(path.join(work, "night.csv"), good);

    const input = page.getByTestId(`observation-csv-${taskId}`);
    await input.setInputFiles(path.join(work, "bad.csv"));
    const refusal = await page.getByTestId("observation-csv-error").innerText({ timeout: 30_000 });
    check(/row 2, decDeg/.test(refusal) && /Nothing from this file was stored/.test(refusal), `refusal names row and field: "${refusal}"`);
    check((await percentShown(page)) === 0, "a refused file must store nothing");
    ctx.log("a bad row is refused by row and field, nothing stored");

    await input.setInputFiles(path.join(work, "night.csv"));
    await page.waitForFunction(() => {
      const el = document.querySelector('[data-testid="covered-probability"]');
      return el !== null && Number.parseFloat((el.textContent ?? "").replace(/[^\d.]/g, "") || "0") > 0;
    }, undefined, { timeout: 30_000 });
    const shown = await percentShown(page);
    const exposures = await page.getByTestId("exposure-count").innerText();
    check(exposures.trim() === "9", `nine exposures counted, shown "${exposures}"`);
    ctx.log(`coverage rose to ${shown} % after the upload`);

    const { scroll, client } = await page.evaluate(() => ({ scroll: document.documentElement.scrollWidth, client: document.documentElement.clientWidth }));
    check(scroll <= client, `the candidate page is ${scroll} px wide at ${client} px`);
    await page.screenshot({ path: `${ctx.artifactsDir}/observations-phone.png`, fullPage: true });
  } finally {
    await close();
  }
}
