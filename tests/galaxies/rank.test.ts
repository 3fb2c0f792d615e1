import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { toColumns, unpack, CellPacker } from "@/lib/galaxies/pack";
import { cellOfFine, fineNestedIndex, galaxyCell } from "@/lib/galaxies/cell";
import { galaxyScores, rankGalaxies, regionCells, topIndices } from "@/lib/galaxies/rank";
import { analyseSkymap } from "@/lib/skymap";

// References: tests/fixtures/scripts/galaxies_make_fixtures.py (scores of every galaxy, numpy) and
// galaxies_rank_fixtures.py (greedy credible regions, their nside-64 cells, region sums and the top 25, numpy/healpy),
// for score = ρ · DISTNORM · N(r; DISTMU, DISTSIGMA) · weight (Singer et al. 2016, ApJL 829 L15 eq. 1 over r²).
const dir = new URL("../fixtures/galaxies/", import.meta.url);
type Top = { name: string; score: number; normalizedScore?: number; cumulativeScore?: number };
const all = JSON.parse(readFileSync(new URL("reference.json", dir), "utf8")) as Record<"flat" | "multiorder", { scores: { total: number; top: Top[] } }>;
const region = JSON.parse(readFileSync(new URL("rank-reference.json", dir), "utf8")) as Record<
  "flat" | "multiorder",
  Record<string, { cells: number[]; considered: number; totalScore: number; top: Top[] }>
>;

const rows = readFileSync(new URL("catalogue.csv", dir), "utf8")
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => {
    const [name = "", ra, dec, dist, weight] = line.split(",");
    return { name, raDeg: Number(ra), decDeg: Number(dec), distanceMpc: Number(dist), weight: Number(weight) };
  });
const catalogue = toColumns(rows);
const nameOf = (id: number) => rows[id]?.name;

function map(file: string) {
  const result = analyseSkymap(new Uint8Array(readFileSync(new URL(file, dir))));
  if (!result.ok) throw result.error;
  return result.map;
}
const maps = { flat: map("map3d-nested-n32.fits.gz"), multiorder: map("map3d-multiorder.fits.gz") };
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe.each(["flat", "multiorder"] as const)("%s 3D map against numpy", (kind) => {
  it("every galaxy's score (top 200 by name and value, and the sum over all 3000)", () => {
    const scores = galaxyScores(maps[kind], catalogue);
    const ref = all[kind].scores;
    expect(rel(scores.reduce((a, b) => a + b, 0), ref.total)).toBeLessThan(1e-9);
    const top = topIndices(scores, 200);
    expect(top.map((k) => rows[k]?.name)).toEqual(ref.top.map((t) => t.name));
    for (const [i, k] of top.entries()) expect(rel(scores[k] ?? 0, ref.top[i]?.score ?? 0)).toBeLessThan(1e-9);
  });

  it.each(["0.5", "0.9", "0.99"])("greedy region at %s: the same index cells, galaxies, sum and top 25", (level) => {
    const ref = region[kind][level]!;
    expect(regionCells(maps[kind], Number(level))).toEqual(ref.cells);
    const ranking = rankGalaxies(maps[kind], catalogue, { level: Number(level), limit: 25 });
    expect(ranking.considered).toBe(ref.considered);
    expect(rel(ranking.totalScore, ref.totalScore)).toBeLessThan(1e-9);
    expect(ranking.galaxies.map((g) => nameOf(g.id))).toEqual(ref.top.map((t) => t.name));
    for (const [i, g] of ranking.galaxies.entries()) {
      expect(rel(g.normalizedScore, ref.top[i]?.normalizedScore ?? 0)).toBeLessThan(1e-9);
      expect(rel(g.cumulativeScore, ref.top[i]?.cumulativeScore ?? 0)).toBeLessThan(1e-9);
    }
  });
});

describe("topIndices", () => {
  it("keeps the best `limit`, best first, ties by index, skipping galaxies outside the region (−1)", () => {
    const scores = Float64Array.from([0.5, -1, 2, 0.5, 3, 0, 2, -1]);
    expect(topIndices(scores, 4)).toEqual([4, 2, 6, 0]);
    expect(topIndices(scores, 100)).toEqual([4, 2, 6, 0, 3, 5]);
    expect(topIndices(scores, 0)).toEqual([]);
  });
});

describe("cell packs", () => {
  it("round-trip every galaxy and its id, grouped by cell, and rank the same as the plain columns", () => {
    const packer = new CellPacker();
    rows.forEach((g, id) => packer.add(galaxyCell(g.raDeg, g.decDeg), id, fineNestedIndex(g.raDeg, g.decDeg), g.distanceMpc, g.weight));
    const packs = packer.drain();
    expect(packer.size).toBe(0);
    expect(packs.reduce((n, p) => n + p.count, 0)).toBe(rows.length);
    expect(new Set(packs.map((p) => p.cell)).size).toBe(packs.length);
    const back = unpack(packs);
    const order = Array.from(back.id).map((id, k) => ({ id, k }));
    for (const { id, k } of order) {
      const g = rows[id]!;
      expect([back.fine[k], back.distanceMpc[k], back.weight[k]]).toEqual([fineNestedIndex(g.raDeg, g.decDeg), g.distanceMpc, g.weight]);
      expect(cellOfFine(back.fine[k] ?? 0)).toBe(galaxyCell(g.raDeg, g.decDeg));
    }
    const fromPacks = rankGalaxies(maps.flat, back, { level: 0.9, limit: 25 });
    expect(fromPacks.galaxies.map((g) => nameOf(g.id))).toEqual(region.flat["0.9"]!.top.map((t) => t.name));
  });
});
