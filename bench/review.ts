/**
 * Response-time review benchmark (npm run bench:review): a year of activity (10 000 candidates, 40 000 tasks,
 * 300 000 events, plus outbox rows) in a temp database, then the review page's queries timed (median of 7 runs
 * after one warm-up) and their query plans printed. Target: under 300 ms. Prints only; asserts nothing.
 * The figures are wall time with the process's CPU time beside it: on a shared machine the CPU time says more.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { SQLiteAsyncDialect } from "drizzle-orm/sqlite-core";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { reviewQueries, type ReviewFilters } from "@/lib/data/review";
import { loadCandidateFacts } from "@/lib/review/facts";
import { buildReviewReport } from "@/lib/services/build-review";
import { listReviewCandidates } from "@/lib/review/list";
import { writeYearOfActivity } from "./review-activity";

const size = { candidates: 10_000, tasks: 40_000, events: 300_000 };
const dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-bench-review-"));
process.env.DATABASE_URL = `file:${path.join(dir, "bench.db")}`;

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] as number;
/** Median wall time of `runs` after one warm-up, with the process's CPU time beside it (the machine may be shared). */
async function time(label: string, fn: () => Promise<unknown>, runs = 7): Promise<number> {
  await fn();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    await fn();
    wall.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  const m = median(wall);
  console.log(
    `${label.padEnd(52)} ${m.toFixed(1).padStart(8)} ms wall (min ${Math.min(...wall).toFixed(1)})  ${median(cpu).toFixed(1).padStart(7)} ms CPU`,
  );
  return m;
}

try {
  const db = await getDb();
  await migrateDatabase(db);
  const nowMs = Date.UTC(2026, 0, 1);
  const t0 = performance.now();
  await writeYearOfActivity(db.$client, size, nowMs);
  const counts = await db.$client.execute(
    "SELECT (SELECT count(*) FROM candidates) c, (SELECT count(*) FROM follow_up_tasks) t, (SELECT count(*) FROM events) e, (SELECT count(*) FROM notifications) n, (SELECT count(*) FROM shifts) s",
  );
  console.log(`seeded in ${((performance.now() - t0) / 1000).toFixed(1)} s:`, JSON.stringify(counts.rows[0]));
  await db.$client.execute("ANALYZE");

  const year: ReviewFilters = { fromMs: nowMs - 365 * 86_400_000, toMs: nowMs };
  const month: ReviewFilters = { fromMs: nowMs - 28 * 86_400_000, toMs: nowMs };
  const oldMonth: ReviewFilters = { fromMs: nowMs - 300 * 86_400_000, toMs: nowMs - 272 * 86_400_000 };
  const tz = "Europe/Berlin";

  console.log("\nquery plans (full year):");
  for (const [name, build] of Object.entries(reviewQueries)) {
    const query = build(year, nowMs);
    const compiled = new SQLiteAsyncDialect().sqlToQuery(query);
    const plan = await db.$client.execute({ sql: `EXPLAIN QUERY PLAN ${compiled.sql}`, args: compiled.params as never[] });
    console.log(`  ${name}:`);
    for (const row of plan.rows) console.log(`    ${String(row.detail)}`);
  }

  console.log("\ntimings (median of 7):");
  for (const [name, build] of Object.entries(reviewQueries)) {
    await time(`query ${name} (year)`, () => db.all(build(year, nowMs)));
  }
  await time("loadCandidateFacts (year)", () => loadCandidateFacts(year, nowMs));
  const results = [
    await time("review page report, last 28 days", () => buildReviewReport({ ...month, nowMs, timeZone: tz })),
    await time("review page report, 28 days ten months ago", () => buildReviewReport({ ...oldMonth, nowMs, timeZone: tz })),
    await time("review page report, full year", () => buildReviewReport({ ...year, nowMs, timeZone: tz })),
    await time("review page report, full year, class=bns", () => buildReviewReport({ ...year, sourceClass: "bns", nowMs, timeZone: tz })),
    await time("click-through list (year, acknowledgement, late)", () =>
      listReviewCandidates({ ...year, nowMs, timeZone: tz }, { step: "acknowledge", late: true, limit: 200 })),
  ];
  const report = await buildReviewReport({ ...year, nowMs, timeZone: tz });
  console.log(`\nfull year: ${report?.candidates} candidates, ${report?.shifts.length} shifts, ${report?.people.length} people, ` +
    `JSON ${(JSON.stringify(report).length / 1024).toFixed(0)} KiB`);
  console.log(`slowest review page figure: ${Math.max(...results).toFixed(1)} ms wall (target < 300 ms)`);
  console.log(`load average while running: ${(await import("node:os")).loadavg().map((x) => x.toFixed(1)).join(" ")} on ${(await import("node:os")).cpus().length} CPUs`);
} finally {
  await closeDb();
  rmSync(dir, { recursive: true, force: true });
}
