import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { galaxyCell } from "@/lib/galaxies/cell";
import { toColumns } from "@/lib/galaxies/pack";
import { rankGalaxies } from "@/lib/galaxies/rank";
import { listCatalogueRecords } from "@/lib/services/list-catalogues";
import { importCatalogueCsv } from "@/lib/services/import-catalogue";
import { analyseSkymap } from "@/lib/skymap";
import { parseCatalogueHeader, parseCatalogueRow, type CatalogueRow } from "@/lib/validations/catalogues";
import { DEMO_GALAXY_COUNT, demoGalaxyCsv } from "@/scripts/demo/galaxies";
import { setupTestDatabase, type TestDatabase } from "../helpers/test-db";

const text = [...demoGalaxyCsv()].join("");
const lines = text.trim().split("\n");
const header = parseCatalogueHeader(lines[0] ?? "");
if (!header.ok) throw new Error("bad header");
const rows: CatalogueRow[] = lines.slice(1).map((line, i) => {
  const parsed = parseCatalogueRow(line, header.columns, header.width, i + 1);
  if (!parsed.ok) throw new Error(`row ${i + 1}: ${parsed.problem.message}`);
  return parsed.row;
});

describe("demo galaxy catalogue", () => {
  it("is the same every time, about 100 000 valid rows with distinct names", () => {
    const again = [...demoGalaxyCsv()].join("");
    expect(createHash("sha256").update(again).digest("hex")).toBe(createHash("sha256").update(text).digest("hex"));
    expect(rows).toHaveLength(DEMO_GALAXY_COUNT);
    expect(new Set(rows.map((r) => r.name)).size).toBe(DEMO_GALAXY_COUNT);
    expect([...demoGalaxyCsv(100, "another seed")].join("")).not.toBe([...demoGalaxyCsv(100)].join(""));
  });

  it("is clustered: the 1 % fullest index cells hold far more than the 1 % a uniform sky would give them", () => {
    const perCell = new Map<number, number>();
    for (const r of rows) perCell.set(galaxyCell(r.raDeg, r.decDeg), (perCell.get(galaxyCell(r.raDeg, r.decDeg)) ?? 0) + 1);
    const counts = [...perCell.values()].sort((a, b) => b - a);
    const top = counts.slice(0, Math.round(49_152 * 0.01)).reduce((a, b) => a + b, 0);
    // uniform: 100 000 over 49 152 cells is Poisson(2.03); in a numpy Poisson draw the top 1 % of cells hold 3.3 % of the galaxies
    expect(top / rows.length).toBeGreaterThan(0.3);
  });

  it("puts galaxies inside the demo localisation's 90 % region, near its distances", () => {
    const result = analyseSkymap(new Uint8Array(readFileSync(new URL("../../scripts/demo/demo-localisation-3d.multiorder.fits.gz", import.meta.url))));
    if (!result.ok) throw result.error;
    const ranking = rankGalaxies(result.map, toColumns(rows), { level: 0.9, limit: 20 });
    expect(ranking.considered).toBeGreaterThan(1000);
    expect(ranking.galaxies[0]?.score).toBeGreaterThan(0);
    expect(ranking.galaxies.at(-1)?.cumulativeScore).toBeGreaterThan(0.01);
  });
});

describe("importCatalogueCsv (the seed's path)", () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await setupTestDatabase();
  });
  afterAll(() => db.cleanup());

  it("imports generated rows as a ready default catalogue with no uploader", async () => {
    async function* bytes() {
      for (const c of demoGalaxyCsv(2500)) yield new TextEncoder().encode(c);
    }
    const made = await importCatalogueCsv(bytes(), { name: "Demo galaxies (fictional)", now: new Date(Date.UTC(2030, 0, 1)) });
    expect(made.rows).toBe(2500);
    expect(await listCatalogueRecords()).toEqual([expect.objectContaining({ id: made.id, state: "ready", isDefault: true, rows: 2500, uploadedById: null })]);
  });
});
