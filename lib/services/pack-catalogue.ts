import type { Database } from "@/db";
import { galaxyPage, hasGalaxyPacks, insertGalaxyPacks } from "@/lib/data/catalogues";
import { cellOfFine, fineNestedIndex } from "@/lib/galaxies/cell";
import { CellPacker } from "@/lib/galaxies/pack";

const PAGE_ROWS = 50_000;

/**
 * Builds the ranking packs of a catalogue imported before they existed (its galaxies are stored, its packs not),
 * once, page by page; every import since writes its packs itself. A second caller racing this one would add
 * duplicate packs, so it runs only when none exist and is cheap to check.
 */
export async function ensureGalaxyPacks(db: Database, catalogueId: string, rowCount: number): Promise<void> {
  if (rowCount === 0 || (await hasGalaxyPacks(db, catalogueId))) return;
  const packer = new CellPacker();
  for (let after = 0; ; ) {
    const page = await galaxyPage(db, catalogueId, after, PAGE_ROWS);
    for (const g of page) {
      const fine = fineNestedIndex(g.raDeg, g.decDeg);
      packer.add(cellOfFine(fine), g.id, fine, g.distanceMpc, g.weight);
    }
    if (page.length < PAGE_ROWS) break;
    after = page.at(-1)?.id ?? after;
  }
  await insertGalaxyPacks(db, catalogueId, packer.drain());
}
