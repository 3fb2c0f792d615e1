import { ang2pix_nest, ang2pix_ring, nest2ring } from "@hscmap/healpix";
import { POW4 } from "./healpix";
import type { SkymapMap } from "./types";

/**
 * @hscmap/healpix's ang2pix_nest is right up to order 15 (checked against its own order-7 answers over random
 * positions); at order 16 its index arithmetic fails (an assertion, and wrong cells). Finer pixels are rare.
 */
const LOOKUP_MAX_ORDER = 15;

/** Index into the map's arrays of the pixel holding each position; −1 where a multi-order map has no pixel. */
export type PixelLocator = (raDeg: number, decDeg: number) => number;

function thetaPhi(raDeg: number, decDeg: number): [number, number] {
  const rad = Math.PI / 180;
  const theta = Math.min(Math.PI, Math.max(0, (90 - decDeg) * rad));
  const phi = ((((raDeg % 360) + 360) % 360) * rad);
  return [theta, phi];
}

/** Order of the fine NESTED index that `fineIndexLocator` takes (the finest ang2pix_nest is right at, see above). */
export const FINE_INDEX_ORDER = LOOKUP_MAX_ORDER;

/** NESTED index at FINE_INDEX_ORDER of a position: enough to find its pixel in any map up to that order. */
export function fineNestedIndex(raDeg: number, decDeg: number): number {
  const [theta, phi] = thetaPhi(raDeg, decDeg);
  return ang2pix_nest(2 ** FINE_INDEX_ORDER, theta, phi);
}

/** Index into the map's arrays from a position's fine NESTED index; −1 where a multi-order map has no pixel. */
export type FineIndexLocator = (fineNested: number) => number;

/**
 * A locator for one map from fine NESTED indices (no trigonometry per position). Flat maps: the index at the map's
 * order is the fine one over 4^(15 − order) (then RING if the file is). Multi-order maps: each pixel is the index
 * range it covers at a fine order, sorted once; a position is found by binary search. Pixels finer than order 15
 * (about 6″) are found as one of those sharing their order-15 cell.
 */
export function fineIndexLocator(map: SkymapMap): FineIndexLocator {
  if (map.layout !== "multiorder") {
    const { nside } = map;
    const shift = POW4[FINE_INDEX_ORDER - Math.min(map.order, FINE_INDEX_ORDER)] ?? 1;
    if (map.layout === "flat-nested") return (fine) => Math.floor(fine / shift);
    return (fine) => nest2ring(nside, Math.floor(fine / shift));
  }
  const fine = Math.min(map.maxOrder, LOOKUP_MAX_ORDER);
  const down = POW4[FINE_INDEX_ORDER - fine] ?? 1;
  const count = map.order.length;
  const starts = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    const o = map.order[i] ?? 0;
    const ipix = map.ipix[i] ?? 0;
    starts[i] = o <= fine ? ipix * (POW4[fine - o] ?? 1) : Math.floor(ipix / (POW4[o - fine] ?? 1));
  }
  const sorted = Array.from({ length: count }, (_, i) => i).sort((a, b) => (starts[a] ?? 0) - (starts[b] ?? 0));
  const sortedStarts = Float64Array.from(sorted, (i) => starts[i] ?? 0);
  const sortedEnds = Float64Array.from(sorted, (i) => {
    const o = map.order[i] ?? 0;
    return (starts[i] ?? 0) + (o <= fine ? (POW4[fine - o] ?? 1) : 1);
  });
  return (fineNested) => {
    const cell = Math.floor(fineNested / down);
    let lo = 0;
    let hi = count - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if ((sortedStarts[mid] ?? 0) <= cell) lo = mid;
      else hi = mid - 1;
    }
    return (sortedStarts[lo] ?? 0) <= cell && cell < (sortedEnds[lo] ?? 0) ? (sorted[lo] ?? -1) : -1;
  };
}

/** A locator for one map from positions: flat maps by ang2pix in the file's ordering, multi-order maps through the fine index. */
export function pixelLocator(map: SkymapMap): PixelLocator {
  if (map.layout !== "multiorder") {
    const { nside } = map;
    const ring = map.layout === "flat-ring";
    return (raDeg, decDeg) => {
      const [theta, phi] = thetaPhi(raDeg, decDeg);
      return ring ? ang2pix_ring(nside, theta, phi) : ang2pix_nest(nside, theta, phi);
    };
  }
  const locate = fineIndexLocator(map);
  return (raDeg, decDeg) => locate(fineNestedIndex(raDeg, decDeg));
}
