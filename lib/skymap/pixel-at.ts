import { ang2pix_nest, ang2pix_ring } from "@hscmap/healpix";
import { POW4 } from "./healpix";
import type { SkymapMap } from "./types";

/** @hscmap/healpix's ang2pix is exact up to order 16 (checked against its pix2ang); finer pixels are rare. */
const LOOKUP_MAX_ORDER = 16;

/** Index into the map's arrays of the pixel holding each position; −1 where a multi-order map has no pixel. */
export type PixelLocator = (raDeg: number, decDeg: number) => number;

function thetaPhi(raDeg: number, decDeg: number): [number, number] {
  const rad = Math.PI / 180;
  const theta = Math.min(Math.PI, Math.max(0, (90 - decDeg) * rad));
  const phi = ((((raDeg % 360) + 360) % 360) * rad);
  return [theta, phi];
}

/**
 * A locator for one map. Flat maps: ang2pix in the file's ordering. Multi-order maps: each pixel is the index range
 * it covers at a fine order, sorted once; a position's fine index is found by binary search. Pixels finer than
 * order 16 (about 3″) are found as one of those sharing their order-16 cell.
 */
export function pixelLocator(map: SkymapMap): PixelLocator {
  if (map.layout !== "multiorder") {
    const { nside } = map;
    const ring = map.layout === "flat-ring";
    return (raDeg, decDeg) => {
      const [theta, phi] = thetaPhi(raDeg, decDeg);
      return ring ? ang2pix_ring(nside, theta, phi) : ang2pix_nest(nside, theta, phi);
    };
  }
  const fine = Math.min(map.maxOrder, LOOKUP_MAX_ORDER);
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
  const nside = 2 ** fine;
  return (raDeg, decDeg) => {
    const [theta, phi] = thetaPhi(raDeg, decDeg);
    const cell = ang2pix_nest(nside, theta, phi);
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
