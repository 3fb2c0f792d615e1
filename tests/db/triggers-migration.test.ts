import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Database } from "@/db/client";
import { migrateDatabase, migrationsFolder } from "@/db/migrate";

/**
 * The triggers migration on a database that already holds candidates: each becomes one trigger with the
 * candidate's id, preferred, its revisions moved to it, and nothing else lost (derived quantities survive).
 */
const triggersTag = "0003_triggers";
let dir: string;
let db: Database;

/** A copy of drizzle/ whose journal stops before the triggers migration: the schema as it was. */
function folderBefore(tag: string): string {
  const folder = path.join(dir, "before");
  cpSync(migrationsFolder, folder, { recursive: true });
  const journalPath = path.join(folder, "meta", "_journal.json");
  const journal = JSON.parse(readFileSync(journalPath, "utf8")) as { entries: Array<{ tag: string; idx: number }> };
  const cut = journal.entries.findIndex((entry) => entry.tag === tag);
  if (cut < 0) throw new Error(`no migration ${tag}`);
  journal.entries = journal.entries.slice(0, cut);
  writeFileSync(journalPath, JSON.stringify(journal));
  return folder;
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-migrate-"));
  db = await openDatabase(`file:${path.join(dir, "old.db")}`);
  await migrateDatabase(db, folderBefore(triggersTag));
  const c = db.$client;
  for (const [id, ext, withdrawn] of [["c1", "S1", null], ["c2", "S2", 5_000]] as const) {
    await c.execute({
      sql:
        "insert into candidates (id, source, external_id, current_revision, stage, triage_state, event_time, received_at, " +
        "updated_at, withdrawn_at, network_snr, false_alarm_rate_per_year, detectors) values (?, 'pipe-a', ?, 2, 'preliminary', 'new', 1000, 2000, 3000, ?, 9.5, 0.01, '[\"X1\"]')",
      args: [id, ext, withdrawn],
    });
    for (const revision of [1, 2]) {
      await c.execute({
        sql: "insert into candidate_revisions (id, candidate_id, revision, stage, event_time, received_at, payload) values (?, ?, ?, 'preliminary', 1000, 2000, '{}')",
        args: [`${id}-r${revision}`, id, revision],
      });
      await c.execute({
        sql: "insert into derived_quantities (revision_id, derived, computed_at) values (?, '{\"kept\":true}', 2000)",
        args: [`${id}-r${revision}`],
      });
    }
  }
  await migrateDatabase(db);
});

afterAll(() => {
  db.$client.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("migrating existing candidates to triggers", () => {
  it("makes one trigger per candidate, with the candidate's id, source, numbers and withdrawal", async () => {
    const rows = (await db.$client.execute("select * from triggers order by id")).rows;
    expect(rows.map((r) => [r.id, r.candidate_id, r.source, r.external_id, r.current_revision, r.withdrawn_at])).toEqual([
      ["c1", "c1", "pipe-a", "S1", 2, null],
      ["c2", "c2", "pipe-a", "S2", 2, 5000],
    ]);
    expect(rows.every((r) => r.network_snr === 9.5 && r.false_alarm_rate_per_year === 0.01 && r.detectors === '["X1"]')).toBe(true);
  });

  it("makes that trigger preferred and the only one", async () => {
    const rows = (await db.$client.execute("select id, preferred_trigger_id, trigger_count, merged_into_id from candidates order by id")).rows;
    expect(rows.map((r) => [r.id, r.preferred_trigger_id, r.trigger_count, r.merged_into_id])).toEqual([
      ["c1", "c1", 1, null],
      ["c2", "c2", 1, null],
    ]);
  });

  it("moves every revision to its trigger and keeps their derived quantities", async () => {
    const rows = (
      await db.$client.execute(
        "select r.id, r.trigger_id, d.derived from candidate_revisions r join derived_quantities d on d.revision_id = r.id order by r.id",
      )
    ).rows;
    expect(rows.map((r) => [r.id, r.trigger_id, r.derived])).toEqual([
      ["c1-r1", "c1", '{"kept":true}'],
      ["c1-r2", "c1", '{"kept":true}'],
      ["c2-r1", "c2", '{"kept":true}'],
      ["c2-r2", "c2", '{"kept":true}'],
    ]);
  });

  it("keeps revisions unique per trigger, no longer per candidate", async () => {
    await expect(
      db.$client.execute(
        "insert into candidate_revisions (id, candidate_id, trigger_id, revision, stage, event_time, received_at, payload) values ('dup', 'c1', 'c1', 2, 'preliminary', 1, 1, '{}')",
      ),
    ).rejects.toThrow(/UNIQUE/);
    await db.$client.execute(
      "insert into triggers (id, candidate_id, source, external_id, current_revision, stage, event_time, received_at, updated_at, network_snr, false_alarm_rate_per_year, detectors) values ('t2', 'c1', 'pipe-b', 'S1', 2, 'preliminary', 1, 1, 1, 8, 0.1, '[]')",
    );
    await db.$client.execute(
      "insert into candidate_revisions (id, candidate_id, trigger_id, revision, stage, event_time, received_at, payload) values ('ok', 'c1', 't2', 2, 'preliminary', 1, 1, '{}')",
    );
  });
});
