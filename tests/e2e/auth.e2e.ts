import { demoPeople } from "@/scripts/demo/scenario";
import { roleLabels } from "@/lib/auth/roles";
import { check, type E2EContext } from "./types";

/** Sign-in per role, a wrong password, and 401/403 JSON from the API (issue: foundation, "What must show"). */
export default async function authE2E(ctx: E2EContext): Promise<void> {
  const { context, close } = await ctx.launchBrowser();
  try {
    const firstOfEachRole = new Map(demoPeople.map((p) => [p.role, p] as const));
    for (const person of firstOfEachRole.values()) {
      const page = await context.newPage();
      await ctx.signIn(page, person.email, person.password);
      await page.waitForSelector('[data-testid="role-label"]');
      const role = await page.locator('nav[aria-label="Main"] [data-testid="role-label"]').first().innerText();
      check(role === roleLabels[person.role], `${person.email}: role label "${role}", expected "${roleLabels[person.role]}"`);
      const menu = await page.locator('nav[aria-label="Main"] a').allInnerTexts();
      check(menu.some((t) => t.includes("Triage board")), `${person.role}: menu lacks Triage board: ${menu.join(", ")}`);
      const seesPeople = menu.some((t) => t.includes("People & roles"));
      check(seesPeople === (person.role === "coordinator" || person.role === "admin"), `${person.role}: People & roles shown=${seesPeople}`);
      // A session cookie of the wrong role gets 403 JSON from a coordinator-only route.
      const res = await page.request.get(`${ctx.baseUrl}/api/v1/users`);
      const expected = person.role === "coordinator" || person.role === "admin" ? 200 : 403;
      check(res.status() === expected, `${person.role}: GET /api/v1/users answered ${res.status()}, expected ${expected}`);
      check((res.headers()["content-type"] ?? "").includes("application/json"), "403/200 must be JSON");
      await page.screenshot({ path: `${ctx.artifactsDir}/home-${person.role}.png` });
      await page.close();
      await context.clearCookies();
    }

    // The board and the candidate list show derived numbers for many candidates: each says, in view, that they are
    // rapid triage estimates and that official parameter estimates and observatory safety rules take precedence.
    const reader = await context.newPage();
    await ctx.signIn(reader, "ada@chirpdesk.test", "demo-shifter");
    for (const path of ["/triage", "/candidates"]) {
      await reader.goto(`${ctx.baseUrl}${path}`);
      const note = reader.locator('main [role="note"]').filter({ hasText: "Rapid estimates" }).first();
      await note.waitFor({ state: "visible", timeout: 15_000 });
      const text = await note.innerText();
      check(/parameter estimates/.test(text) && /safety rules/.test(text), `${path}: caution reads "${text}"`);
    }
    await reader.close();
    await context.clearCookies();

    // Signing out ends the session: the next protected page sends us back to sign-in.
    const leaving = await context.newPage();
    await ctx.signIn(leaving, "cleo@chirpdesk.test", "demo-coordinator");
    await leaving.locator('nav[aria-label="Main"] button[aria-label="Sign out"]').first().click();
    await leaving.waitForURL((url) => url.pathname === "/sign-in", { timeout: 15_000 });
    await leaving.goto(`${ctx.baseUrl}/rota`);
    check(new URL(leaving.url()).pathname === "/sign-in", `after signing out, /rota went to ${leaving.url()}`);
    await leaving.close();

    const page = await context.newPage();
    await page.goto(`${ctx.baseUrl}/sign-in`);
    await page.fill("#email", "ada@chirpdesk.test");
    await page.fill("#password", "not-the-password");
    await page.click("button[type=submit]");
    const error = await page.waitForSelector('[data-testid="sign-in-error"]', { timeout: 15_000 });
    const text = await error.innerText();
    check(/do not match/.test(text), `wrong password message: "${text}"`);

    // Unauthenticated pages redirect to our sign-in page; the API answers 401 JSON.
    await page.goto(`${ctx.baseUrl}/triage`);
    check(new URL(page.url()).pathname === "/sign-in", `unauthenticated /triage went to ${page.url()}`);
    const anon = await fetch(`${ctx.baseUrl}/api/v1/users`);
    check(anon.status === 401, `anonymous API call answered ${anon.status}`);
    const body = (await anon.json()) as { error?: string };
    check(typeof body.error === "string", "401 body must be JSON with an error");
  } finally {
    await close();
  }
}
