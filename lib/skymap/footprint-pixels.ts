import { collectPixelsInDisc, DiscPixels } from "./disc";
import { placeFootprint, type Footprint, type PlacedFootprint } from "./footprint";
import { POW4, ringToNest } from "./healpix";
import { appendIndex, newIndexList, type IndexList } from "./index-list";
import { multiOrderCentres } from "./multiorder";
import type { FlatSkymap, MultiOrderSkymap, SkymapMap } from "./types";

/**
 * Pixels of a map inside a footprint, as indices into the map's own arrays. A pixel is inside when its
 * CENTRE is (no partial pixels), at the map's own resolution: for a multi-order map each pixel is tested at
 * its own order, so a coarse pixel counts whole or not at all. This is healpy's query_polygon / query_disc
 * with inclusive=False, applied per order.
 */
export function footprintPixels(map: SkymapMap, placed: PlacedFootprint): number[] {
  return Array.from(footprintPixelIndices(map, placed));
}

/** footprintPixels as a fresh typed array (no per-pixel boxing), same pixels in the same order. */
export function footprintPixelIndices(map: SkymapMap, placed: PlacedFootprint): Uint32Array {
  const out = scratch;
  out.length = 0;
  if (map.layout === "multiorder") multiOrderPixels(map, placed, out);
  else flatPixels(map, placed, out);
  return out.values.slice(0, out.length);
}

/** Sum of the probabilities of the pixels whose centres fall inside the footprint placed at (raDeg, decDeg). */
export function footprintProbability(map: SkymapMap, footprint: Footprint, raDeg: number, decDeg: number): number {
  const { probability } = map;
  let sum = 0;
  for (const i of footprintPixelIndices(map, placeFootprint(footprint, raDeg, decDeg))) sum += probability[i] ?? 0;
  return sum;
}

// reused between calls: the search functions never call out, so never re-enter
const scratch = newIndexList();
const disc = new DiscPixels();

/** Flat maps: the ring-wise disc query over the bounding cone, then the exact test on each candidate centre. */
function flatPixels(map: FlatSkymap, placed: PlacedFootprint, out: IndexList): void {
  const { nside } = map;
  const ring = map.layout === "flat-ring";
  collectPixelsInDisc(nside, placed.centre, Math.cos(placed.boundRadiusRad), disc);
  const { ringPix, z: zs, phi: phis } = disc;
  for (let k = 0; k < disc.length; k++) {
    const z = zs[k] ?? 0;
    const phi = phis[k] ?? 0;
    const s = Math.sqrt((1 - z) * (1 + z));
    if (!placed.contains(s * Math.cos(phi), s * Math.sin(phi), z)) continue;
    const p = ringPix[k] ?? 0;
    appendIndex(out, ring ? p : ringToNest(nside, p));
  }
}

/** Pixels of a multi-order map grouped by the cell (NESTED, at a bucket order) that holds each centre. */
export interface BucketIndex {
  order: number;
  /** members[start[cell]] … members[start[cell + 1] − 1] are the map's pixels whose centres lie in cell. */
  start: Uint32Array;
  members: Uint32Array;
}

const MAX_BUCKET_ORDER = 9;
const indexCache = new WeakMap<MultiOrderSkymap, BucketIndex>();

/**
 * Built once per map: about as many cells as pixels (at most order 9). A pixel of order o ≥ B has its centre in
 * its ancestor cell at B; for o < B its centre is the corner its four children share, which lies in (the closed
 * cell of) its first child at B. Every pixel is therefore within one cell radius of its cell's centre.
 */
export function bucketIndex(map: MultiOrderSkymap): BucketIndex {
  const cached = indexCache.get(map);
  if (cached) return cached;
  const count = map.order.length;
  let order = 0;
  while (order < Math.min(map.maxOrder, MAX_BUCKET_ORDER) && 12 * (POW4[order + 1] ?? 0) <= count) order++;
  const cells = 12 * (POW4[order] ?? 1);
  const cellOf = new Uint32Array(count);
  const start = new Uint32Array(cells + 1);
  for (let i = 0; i < count; i++) {
    const o = map.order[i] ?? 0;
    const ipix = map.ipix[i] ?? 0;
    const cell = o >= order ? Math.floor(ipix / (POW4[o - order] ?? 1)) : ipix * (POW4[order - o] ?? 1);
    cellOf[i] = cell;
    start[cell + 1] = (start[cell + 1] ?? 0) + 1;
  }
  for (let c = 0; c < cells; c++) start[c + 1] = (start[c + 1] ?? 0) + (start[c] ?? 0);
  const fill = start.slice(0, cells);
  const members = new Uint32Array(count);
  for (let i = 0; i < count; i++) {
    const cell = cellOf[i] ?? 0;
    members[fill[cell] ?? 0] = i;
    fill[cell] = (fill[cell] ?? 0) + 1;
  }
  const index = { order, start, members };
  indexCache.set(map, index);
  return index;
}

/**
 * Cells whose centres lie within the bounding radius plus one cell radius hold every pixel centre that can be
 * inside (healpy's max_pixrad · nside stays below 1.07 at every order; 1.1 is used).
 */
function multiOrderPixels(map: MultiOrderSkymap, placed: PlacedFootprint, out: IndexList): void {
  const { order, start, members } = bucketIndex(map);
  const centres = multiOrderCentres(map);
  const nside = 2 ** order;
  const radius = Math.min(Math.PI, placed.boundRadiusRad + 1.1 / nside);
  collectPixelsInDisc(nside, placed.centre, Math.cos(radius), disc);
  const { ringPix } = disc;
  for (let c = 0; c < disc.length; c++) {
    const cell = ringToNest(nside, ringPix[c] ?? 0);
    const end = start[cell + 1] ?? 0;
    for (let k = start[cell] ?? 0; k < end; k++) {
      const i = members[k] ?? 0;
      if (placed.contains(centres[3 * i] ?? 0, centres[3 * i + 1] ?? 0, centres[3 * i + 2] ?? 0)) appendIndex(out, i);
    }
  }
}
