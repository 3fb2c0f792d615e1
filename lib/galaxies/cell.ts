import { ang2pix_nest } from "@hscmap/healpix";
import { GALAXY_CELL_NSIDE } from "@/db/schema/galaxies";

/** The NESTED cell at the catalogue index's nside (db/schema/galaxies.ts) holding a position. */
export function galaxyCell(raDeg: number, decDeg: number): number {
  const rad = Math.PI / 180;
  const theta = Math.min(Math.PI, Math.max(0, (90 - decDeg) * rad));
  const phi = (((raDeg % 360) + 360) % 360) * rad;
  return ang2pix_nest(GALAXY_CELL_NSIDE, theta, phi);
}
