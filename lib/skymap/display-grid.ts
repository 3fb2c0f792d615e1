import { credibleLevels } from "./credible";
import { SkymapError } from "./errors";
import { nside2npix, nsideToOrder, ringToNest } from "./healpix";
import type { FlatSkymap, SkymapMap } from "./types";

/** A coarse flat NESTED copy of a map, small enough to store and draw (nside 64: 49 152 pixels). */
export interface DisplayGrid {
  nside: number;
  /** Probability per pixel in NESTED order, total 1. */
  probability: Float64Array;
  /** Greedy credible level per pixel: draw the 50 % / 90 % contours as the edges of {level ≤ p}. */
  credibleLevel: Float64Array;
}

export const MAX_DISPLAY_NSIDE = 256;

/**
 * Resamples any map onto a flat NESTED grid: finer pixels are summed into their parent, coarser ones
 * are spread evenly over their children (the NESTED hierarchy, Górski et al. 2005, §4).
 */
export function toDisplayGrid(map: SkymapMap, nside = 64): DisplayGrid {
  const gridOrder = nsideToOrder(nside);
  if (gridOrder === undefined || nside > MAX_DISPLAY_NSIDE) {
    throw new SkymapError("bad-grid", `display nside must be a power of two up to ${MAX_DISPLAY_NSIDE}, got ${nside}`);
  }
  const grid = new Float64Array(nside2npix(nside));
  if (map.layout === "multiorder") {
    for (let i = 0; i < map.probability.length; i++) {
      addPixel(grid, gridOrder, map.order[i] ?? 0, map.ipix[i] ?? 0, map.probability[i] ?? 0);
    }
  } else if (map.order >= gridOrder) {
    // the common case, millions of pixels: one division per pixel, no calls
    const ring = map.layout === "flat-ring";
    const span = 4 ** (map.order - gridOrder);
    const { probability, nside: mapNside } = map;
    for (let i = 0; i < probability.length; i++) {
      const parent = Math.floor((ring ? ringToNest(mapNside, i) : i) / span);
      grid[parent] = (grid[parent] ?? 0) + (probability[i] ?? 0);
    }
  } else {
    const ring = map.layout === "flat-ring";
    for (let i = 0; i < map.probability.length; i++) {
      addPixel(grid, gridOrder, map.order, ring ? ringToNest(map.nside, i) : i, map.probability[i] ?? 0);
    }
  }
  return withLevels(nside, grid);
}

function addPixel(grid: Float64Array, gridOrder: number, order: number, nest: number, prob: number): void {
  if (order >= gridOrder) {
    const parent = Math.floor(nest / 4 ** (order - gridOrder));
    grid[parent] = (grid[parent] ?? 0) + prob;
    return;
  }
  const span = 4 ** (gridOrder - order);
  const share = prob / span;
  for (let child = nest * span; child < (nest + 1) * span; child++) grid[child] = (grid[child] ?? 0) + share;
}

function withLevels(nside: number, probability: Float64Array): DisplayGrid {
  return { nside, probability, credibleLevel: credibleLevels(probability, probability) };
}

/** Sums groups of four NESTED pixels until the grid has the requested (coarser) nside. */
export function degradeDisplayGrid(grid: DisplayGrid, nside: number): DisplayGrid {
  const from = nsideToOrder(grid.nside) ?? 0;
  const to = nsideToOrder(nside);
  if (to === undefined || to > from) {
    throw new SkymapError("bad-grid", `cannot degrade an nside-${grid.nside} grid to nside ${nside}`);
  }
  const span = 4 ** (from - to);
  const out = new Float64Array(nside2npix(nside));
  for (let i = 0; i < grid.probability.length; i++) {
    const parent = Math.floor(i / span);
    out[parent] = (out[parent] ?? 0) + (grid.probability[i] ?? 0);
  }
  return withLevels(nside, out);
}

/** The grid as a flat NESTED map, so coneProbability can answer coarse queries from stored grids. */
export function displayGridToMap(grid: DisplayGrid): FlatSkymap {
  return { layout: "flat-nested", nside: grid.nside, order: nsideToOrder(grid.nside) ?? 0, probability: grid.probability };
}

// Stored form: "HPXG", version byte 1, three zero bytes, nside (uint32 LE), probabilities (float32 LE)
const MAGIC = [0x48, 0x50, 0x58, 0x47];
const HEADER_BYTES = 12;

export function encodeDisplayGrid(grid: DisplayGrid): Uint8Array {
  const out = new Uint8Array(HEADER_BYTES + 4 * grid.probability.length);
  out.set(MAGIC, 0);
  out[4] = 1;
  const view = new DataView(out.buffer);
  view.setUint32(8, grid.nside, true);
  for (let i = 0; i < grid.probability.length; i++) view.setFloat32(HEADER_BYTES + 4 * i, grid.probability[i] ?? 0, true);
  return out;
}

export function decodeDisplayGrid(bytes: Uint8Array): DisplayGrid {
  if (bytes.length < HEADER_BYTES || MAGIC.some((b, i) => bytes[i] !== b) || bytes[4] !== 1) {
    throw new SkymapError("bad-grid", "not a stored display grid (magic HPXG, version 1)");
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const nside = view.getUint32(8, true);
  if (nsideToOrder(nside) === undefined || nside > MAX_DISPLAY_NSIDE) {
    throw new SkymapError("bad-grid", `stored display grid has nside ${nside}`);
  }
  const npix = nside2npix(nside);
  if (bytes.length !== HEADER_BYTES + 4 * npix) {
    throw new SkymapError("bad-grid", `stored nside-${nside} grid needs ${HEADER_BYTES + 4 * npix} bytes, got ${bytes.length}`);
  }
  const probability = new Float64Array(npix);
  let total = 0;
  for (let i = 0; i < npix; i++) {
    const p = view.getFloat32(HEADER_BYTES + 4 * i, true);
    if (!(p >= 0) || !Number.isFinite(p)) throw new SkymapError("bad-grid", `stored grid pixel ${i} is ${p}`);
    probability[i] = p;
    total += p;
  }
  if (!(total > 0)) throw new SkymapError("bad-grid", "stored grid holds no probability");
  for (let i = 0; i < npix; i++) probability[i] = (probability[i] ?? 0) / total; // undo float32 rounding
  return withLevels(nside, probability);
}
