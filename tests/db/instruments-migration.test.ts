import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { openDatabase, type Database } from "@/db/client";
import { migrateDatabase, migrationsFolder } from "@/db/migrate";

/** The instruments migration on a database that already holds sites: each gets one square instrument of its area. */
const instrumentsTag = "0005_instruments";
let dir: string;
let db: Database;

function folderBefore(tag: string): string {
  const folder = path.join(dir, "before");
  cpSync(migrationsFolder, folder, { recursive: true });
  const journalPath = path.join(folder, "meta", "_journal.json");
  const journal = JSON.parse(readFileSync(journalPath, "utf8")) as { entries: Array<{ tag: string }> };
  const cut = journal.entries.findIndex((entry) => entry.tag === tag);
  if (cut < 0) throw new Error(`no migration ${tag}`);
  journal.entries = journal.entries.slice(0, cut);
  writeFileSync(journalPath, JSON.stringify(journal));
  return folder;
}

beforeAll(async () => {
  dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-migrate-"));
  db = await openDatabase(`file:${path.join(dir, "old.db")}`);
  await migrateDatabase(db, folderBefore(instrumentsTag));
  for (const [id, code, area] of [["s1", "AAA", 9.6], ["s2", "BBB", 0.05]] as const) {
    await db.$client.execute({
      sql: "insert into sites (id, code, name, latitude_deg, longitude_deg, elevation_m, field_of_view_deg2, created_at) values (?, ?, 'Fictional', 0, 0, 0, ?, 1000)",
      args: [id, code, area],
    });
  }
  await migrateDatabase(db);
});

afterAll(() => {
  db.$client.close();
  rmSync(dir, { recursive: true, force: true });
});

describe("migrating sites to instruments", () => {
  it("gives each site one square instrument whose side is the square root of its old field of view", async () => {
    const rows = (await db.$client.execute("select site_id, footprint, filters, exposure_s, overhead_s, id from instruments order by site_id")).rows;
    expect(rows.map((r) => r.site_id)).toEqual(["s1", "s2"]);
    const expected = { s1: Math.sqrt(9.6), s2: Math.sqrt(0.05) } as Record<string, number>;
    for (const r of rows) {
      const fp = JSON.parse(String(r.footprint)) as { shape: string; widthDeg: number; heightDeg: number };
      expect(fp.shape).toBe("rectangle");
      expect(fp.widthDeg).toBeCloseTo(expected[String(r.site_id)]!, 12);
      expect(fp.heightDeg).toBe(fp.widthDeg);
      expect(JSON.parse(String(r.filters))).toEqual([]);
      expect(String(r.id)).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-8[0-9a-f]{3}-[0-9a-f]{12}$/);
    }
  });
});
