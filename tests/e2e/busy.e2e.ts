import Database from "libsql";
import { check, type E2EContext } from "./types";

/**
 * Issue 13 item 14 against the real server: while another process holds the database file's write lock, a write
 * waits (on timers) and the same server keeps answering a static file and a signed-in read; once the lock is
 * released the write completes. The 503 after DATABASE_BUSY_WAIT_MS is checked route by route in tests/db.
 */
export default async function busyE2E(ctx: E2EContext): Promise<void> {
  const { context, close } = await ctx.launchBrowser();
  let holder: Database.Database | undefined;
  try {
    const page = await context.newPage();
    await ctx.signIn(page, "ada@chirpdesk.test", "demo-shifter");
    const me = (await (await page.request.get(`${ctx.baseUrl}/api/v1/me`)).json()) as { user: { timeZone: string } };

    holder = new Database(ctx.databaseUrl.replace(/^file:/, ""), { timeout: 0 });
    holder.exec("BEGIN IMMEDIATE");
    let writeSettled = false;
    const write = page.request
      .patch(`${ctx.baseUrl}/api/v1/me`, { data: { timeZone: me.user.timeZone }, headers: { origin: ctx.baseUrl } })
      .finally(() => (writeSettled = true));
    // Give the write time to reach the server and meet the lock (it waits up to 10 s there).
    await new Promise((resolve) => setTimeout(resolve, 300));

    const icon = await fetch(`${ctx.baseUrl}/icon.svg`);
    check(icon.status === 200, `a static file answered ${icon.status} while a write waited`);
    const board = await page.request.get(`${ctx.baseUrl}/api/v1/board`);
    check(board.status() === 200, `a signed-in read answered ${board.status()} while a write waited`);
    check(!writeSettled, "the write finished while another process held the lock");

    holder.exec("ROLLBACK");
    holder.close();
    holder = undefined;
    const answer = await write;
    check(answer.status() === 200, `the write answered ${answer.status()} once the lock was released: ${await answer.text()}`);
  } finally {
    if (holder?.open) {
      holder.exec("ROLLBACK");
      holder.close();
    }
    await close();
  }
}
