import { acknowledgeButtonLabel } from "@/lib/notify/ack-copy";
import { pagingPayload } from "@/tests/support/paging-payload";
import { check, type E2EContext } from "./types";

interface ShiftJson {
  startsAt: string;
  endsAt: string;
  primary: { id: string; name: string };
}

/**
 * Paging in the browser against the production build, the worker process and the fakes: the rota for a
 * coordinator and a shifter, a posted candidate reaching the on-call primary in the app and by e-mail, the
 * e-mail's acknowledge page (GET shows, the button acknowledges, a second use is refused), and the dev
 * mailbox hidden in production.
 */
export default async function pagingE2E(ctx: E2EContext): Promise<void> {
  const { context, close } = await ctx.launchBrowser();
  try {
    const coordinator = await context.newPage();
    await ctx.signIn(coordinator, "cleo@chirpdesk.test", "demo-coordinator");
    await coordinator.goto(`${ctx.baseUrl}/rota`);
    await coordinator.waitForSelector('[data-testid="rota-table"] tbody tr', { timeout: 20_000 });
    check(await coordinator.getByRole("button", { name: "Add shift" }).isVisible(), "coordinator sees Add shift");
    check(await coordinator.locator('[data-testid="escalation-policy"]').isVisible(), "the escalation policy is shown");
    await coordinator.screenshot({ path: `${ctx.artifactsDir}/paging-rota.png`, fullPage: true });

    // Who is on call now, read through the API with the coordinator's session.
    const now = Date.now();
    const range = `from=${new Date(now - 86_400_000).toISOString()}&to=${new Date(now + 86_400_000).toISOString()}`;
    const rota = (await (await coordinator.request.get(`${ctx.baseUrl}/api/v1/rota?${range}`)).json()) as { shifts: ShiftJson[] };
    const shift = rota.shifts.filter((s) => Date.parse(s.startsAt) <= now && Date.parse(s.endsAt) > now).pop();
    check(shift, "the seeded rota has someone on call now");
    const primaryEmail = shift.primary.name.startsWith("Ada") ? "ada@chirpdesk.test" : "emil@chirpdesk.test";
    ctx.log(`on call: ${shift.primary.name}`);
    await coordinator.close();
    await context.clearCookies();

    const primary = await context.newPage();
    await ctx.signIn(primary, primaryEmail, "demo-shifter");
    await primary.goto(`${ctx.baseUrl}/rota`);
    await primary.waitForSelector('[data-testid="rota-week"]');
    check((await primary.getByRole("button", { name: "Add shift" }).count()) === 0, "a shifter reads the rota without editing it");

    const externalId = `E2E-PG-${now}`;
    const since = now - 1;
    const posted = await ctx.postCandidate(pagingPayload(externalId, new Date(now - 15_000)));
    check(posted.status === 201, `feed answered ${posted.status}: ${JSON.stringify(posted.body)}`);

    // In the app (the list polls every 10 s) …
    await primary.goto(`${ctx.baseUrl}/notifications`);
    await primary.getByText(`New candidate ${externalId}`).first().waitFor({ timeout: 30_000 });
    await primary.screenshot({ path: `${ctx.artifactsDir}/paging-notifications.png` });
    const mailbox = await primary.goto(`${ctx.baseUrl}/dev/mailbox`);
    check(mailbox?.status() === 404, `the dev mailbox in production answered ${mailbox?.status()}`);

    // … and by e-mail through the worker and the fake SMTP server.
    const [mail] = await ctx.fakes.smtp.waitForMessages(1, { to: primaryEmail, sinceMs: since, timeoutMs: 30_000 });
    check(mail && mail.subject.includes(externalId), `e-mail subject "${mail?.subject}"`);
    const link = /(https?:\/\/\S+\/ack\/\S+)/.exec(mail.text)?.[1];
    check(link, "the e-mail carries an acknowledge link");
    check(mail.html?.includes("Acknowledge"), "the e-mail has an HTML part with the button");

    // A fresh browser (a phone's mail app): opening the link changes nothing; the button acknowledges.
    await context.clearCookies();
    const phone = await context.newPage();
    await phone.goto(link);
    await phone.waitForSelector('[data-testid="ack-page"][data-state="ready"]');
    await phone.getByRole("button", { name: acknowledgeButtonLabel }).click();
    await phone.waitForSelector('[data-testid="ack-page"][data-state="done"]', { timeout: 15_000 });
    const done = await phone.locator('[data-testid="ack-message"]').innerText();
    check(/Acknowledged/.test(done), `after the button: "${done}"`);
    await phone.screenshot({ path: `${ctx.artifactsDir}/paging-ack-done.png` });

    await phone.goto(link);
    await phone.waitForSelector('[data-testid="ack-page"][data-state="refused"]');
    const reused = await phone.locator('[data-testid="ack-message"]').innerText();
    check(/already used/.test(reused), `a reused link: "${reused}"`);
    const again = await fetch(`${link}/confirm`, { method: "POST", headers: { accept: "application/json" } });
    check(again.status === 409, `a reused link by POST answered ${again.status}`);
    const forged = await fetch(`${link.slice(0, -4)}AAAA/confirm`, { method: "POST", headers: { accept: "application/json" } });
    check(forged.status === 403, `a forged link answered ${forged.status}`);

    const sw = await fetch(`${ctx.baseUrl}/sw.js`);
    check(sw.ok && (await sw.text()).includes("notificationclick"), "the service worker is served");
  } finally {
    await close();
  }
}
