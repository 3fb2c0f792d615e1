/**
 * A second (and third) process posting to the same database, for the cross-process duplicate test.
 *   tsx tests/feed/support/ingest-process.ts <bodies.json> <start-at-ms>
 * Prints one JSON line: the status of each post, in order.
 */
import { readFileSync } from "node:fs";
import { closeDb } from "@/db";
import { POST as route } from "@/app/api/v1/feed/candidates/route";
import { feedRequest } from "./feed-helpers";

async function main(): Promise<void> {
  const [file, startAt] = process.argv.slice(2);
  const bodies = JSON.parse(readFileSync(file ?? "", "utf8")) as string[];
  await new Promise((resolve) => setTimeout(resolve, Math.max(0, Number(startAt) - Date.now())));
  const statuses: number[] = [];
  for (const body of bodies) {
    const res = await route(feedRequest(body));
    if (res.status >= 500) console.error(await res.text());
    statuses.push(res.status);
  }
  await closeDb();
  console.log(JSON.stringify(statuses));
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
