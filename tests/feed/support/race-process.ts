/**
 * One of two processes racing to post triggers of the same signals to one database, for the grouping race test.
 *   tsx tests/feed/support/race-process.ts <bodies.json> <start-at-ms> <round-ms>
 * Posts body i at start + i × round (both processes share the schedule, so each round is a race) and prints one
 * JSON line: { status, id, outcome } of each post, in order.
 */
import { readFileSync } from "node:fs";
import { closeDb } from "@/db";
import { POST as feedIngest } from "@/app/api/v1/feed/candidates/route";
import { feedRequest } from "./feed-helpers";

async function main(): Promise<void> {
  const [file, startAt, roundMs] = process.argv.slice(2);
  const bodies = JSON.parse(readFileSync(file ?? "", "utf8")) as string[];
  const route = feedIngest;
  const answers: Array<{ status: number; id?: string; outcome?: string }> = [];
  for (const [round, body] of bodies.entries()) {
    const due = Number(startAt) + round * Number(roundMs);
    await new Promise((resolve) => setTimeout(resolve, Math.max(0, due - Date.now())));
    const res = await route(feedRequest(body));
    const json = (await res.json()) as { id?: string; outcome?: string };
    if (res.status >= 500) console.error(JSON.stringify(json));
    answers.push({ status: res.status, id: json.id, outcome: json.outcome });
  }
  await closeDb();
  console.log(JSON.stringify(answers));
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
