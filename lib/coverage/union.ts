import { placeFootprint, type Footprint } from "@/lib/skymap/footprint";
import { footprintPixels } from "@/lib/skymap/footprint-pixels";
import { pixelAreaSr, SR_TO_DEG2 } from "@/lib/skymap/healpix";
import type { SkymapMap } from "@/lib/skymap/types";

/**
 * The union of observed footprints on one sky map, kept as a pixel mask so that an overlap is counted once.
 * A pixel is covered when its centre lies inside some footprint, at the map's own resolution (the footprint
 * module's rule, healpy query_polygon / query_disc with inclusive=False). Adding a footprint costs only its
 * own pixels, so a growing log is updated without recomputing what was already covered.
 */
export class CoverageMask {
  readonly covered: Uint8Array;
  private probability = 0;
  private areaSr = 0;
  private readonly flatAreaSr: number | null;

  constructor(private readonly map: SkymapMap) {
    this.covered = new Uint8Array(map.probability.length);
    this.flatAreaSr = map.layout === "multiorder" ? null : pixelAreaSr(map.order);
  }

  /** Marks the footprint's pixels; answers the probability newly covered (0 when it only re-images). */
  add(footprint: Footprint, raDeg: number, decDeg: number): number {
    return this.addPixels(footprintPixels(this.map, placeFootprint(footprint, raDeg, decDeg)));
  }

  /** Marks pixels already found (indices into the map's arrays); answers the probability newly covered. */
  addPixels(pixels: readonly number[]): number {
    const { covered, map } = this;
    let gained = 0;
    for (const i of pixels) {
      if (covered[i]) continue;
      covered[i] = 1;
      gained += map.probability[i] ?? 0;
      this.areaSr += this.flatAreaSr ?? pixelAreaSr(map.layout === "multiorder" ? (map.order[i] ?? 0) : 0);
    }
    this.probability += gained;
    return gained;
  }

  get coveredProbability(): number {
    return Math.min(1, this.probability);
  }

  get coveredAreaDeg2(): number {
    return this.areaSr * SR_TO_DEG2;
  }
}
