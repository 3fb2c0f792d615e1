import { GALAXY_CELL_ORDER } from "@/db/schema/galaxies";
import { POW4 } from "@/lib/skymap/healpix";
import { FINE_INDEX_ORDER, fineNestedIndex } from "@/lib/skymap/pixel-at";

export { fineNestedIndex };

const CELL_DIVISOR = POW4[FINE_INDEX_ORDER - GALAXY_CELL_ORDER] ?? 1;

/** The catalogue index cell (NESTED at GALAXY_CELL_ORDER) holding a fine NESTED index: nested, so a division. */
export function cellOfFine(fineNested: number): number {
  return Math.floor(fineNested / CELL_DIVISOR);
}

/** The NESTED cell at the catalogue index's nside (db/schema/galaxies.ts) holding a position. */
export function galaxyCell(raDeg: number, decDeg: number): number {
  return cellOfFine(fineNestedIndex(raDeg, decDeg));
}
