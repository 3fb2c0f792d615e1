import { collectPixelsInDisc, DiscPixels } from "./disc";
import type { PlacedFootprint } from "./footprint";
import { bucketIndex } from "./footprint-pixels";
import { nestToRingCentre, POW4, ringToNest } from "./healpix";
import { appendIndex, type IndexList } from "./index-list";
import { multiOrderCentres } from "./multiorder";
import type { MultiOrderSkymap, SkymapMap } from "./types";

/** Cells of the coarsest bucket order a flat-map search keeps a slot table for (12·4^8 ≈ 786 000 entries). */
const MAX_FLAT_BUCKET_ORDER = 8;
/** Above healpy's max_pixrad · nside (below 1.07 at every order): a cell's pixel centres lie within this / nside. */
const CELL_RADIUS_NSIDE = 1.1;

/**
 * Many footprint queries on one map (a plan's candidate centres): the same pixels as footprintPixels (centres
 * inside, each pixel at its own order), found without walking the map's own rings for every query. Pixels are
 * grouped by the NESTED cell (at a bucket order) that holds their centre; a query walks the cells whose centres
 * lie within the footprint's bounding radius plus one cell radius and tests each member's centre with the
 * footprint's numeric test inlined.
 * Flat maps: a cell's pixels are a run of NESTED indices; their centres and map indices are computed once per
 * search, when a query first reaches the cell, and kept while the search lives (about 32 bytes per pixel near
 * the queries, so a plan over 1000 deg² at nside 512 keeps some 4 MB). Multi-order maps: the map's own bucket
 * index and centre cache (footprint-pixels.ts).
 * Pixels come out cell by cell, so their order differs from footprintPixels'; the set is the same.
 */
export class FootprintSearch {
  private readonly disc = new DiscPixels();
  private cells = new Float64Array(1024);
  private kinds = new Uint8Array(1024);
  private readonly nside: number;
  /** Cell radius to add to the bounding radius (0 when the cells are the map's own pixels). */
  private readonly marginRad: number;
  private readonly flat: FlatCells | null;
  /** Cell radius for the whole-cell tests; 0 (no cell tests) when cells hold few pixels and testing them is as cheap. */
  private readonly classifyRad: number;

  /** bucketOrder: the order of the cells to group pixels by (flat maps: capped at the map's order and at 8). */
  constructor(private readonly map: SkymapMap, bucketOrder: number) {
    if (map.layout === "multiorder") {
      this.nside = 2 ** bucketIndex(map).order;
      this.marginRad = CELL_RADIUS_NSIDE / this.nside;
      this.flat = null;
      this.classifyRad = this.marginRad;
    } else {
      const order = Math.max(0, Math.min(bucketOrder, map.order, MAX_FLAT_BUCKET_ORDER));
      this.nside = 2 ** order;
      this.marginRad = order === map.order ? 0 : CELL_RADIUS_NSIDE / this.nside;
      this.flat = new FlatCells(map.nside, map.order - order, map.layout === "flat-ring", order);
      this.classifyRad = this.flat.span >= 16 ? this.marginRad : 0;
    }
  }

  /** Appends the indices (into the map's arrays) of the pixels inside `placed` to `out`. */
  collect(placed: PlacedFootprint, out: IndexList): void {
    const radius = Math.min(Math.PI, placed.boundRadiusRad + this.marginRad);
    const disc = this.disc;
    collectPixelsInDisc(this.nside, placed.centre, Math.cos(radius), disc);
    const n = disc.length;
    const { ringPix } = disc;
    if (this.cells.length < n) {
      this.cells = new Float64Array(2 * n);
      this.kinds = new Uint8Array(2 * n);
    }
    const cells = this.cells;
    const kinds = this.kinds;
    classifyCells(disc, n, this.classifyRad, placed, kinds);
    const flat = this.flat;
    if (flat) {
      // flat cells are kept by their RING index: no index conversion per query
      for (let c = 0; c < n; c++) cells[c] = flat.ensure(ringPix[c] ?? 0);
      scanRuns(flat.centres, flat.ids, cells, kinds, n, flat.span, placed, out);
    } else {
      const multi = this.map as MultiOrderSkymap;
      const { order, start, members } = bucketIndex(multi);
      const nestOf = nestOfRingCells(multi, order);
      for (let c = 0; c < n; c++) cells[c] = nestOf[ringPix[c] ?? 0] ?? 0;
      scanMembers(multiOrderCentres(multi), start, members, cells, kinds, n, placed, out);
    }
  }
}

const OUTSIDE = 0;
const INSIDE = 1;
const MIXED = 2;
/** Margin for the cell tests, far above the rounding of the per-pixel test (~1e-16), far below any cell. */
const CLASSIFY_EPS = 1e-12;

/**
 * Marks each cell of the walk as wholly outside, wholly inside or mixed, so only mixed cells test their pixels.
 * Every pixel centre of a cell lies within cellRadius of the cell's centre q (the cap C(q, r)). A rectangle is
 * the intersection of the half-spaces p·(±e − ξc) ≤ 0, p·(±n − ηc) ≤ 0 and p·c > 0 (footprint.ts); a cap lies
 * in p·m ≤ 0 when q·m ≤ −sin r·|m| and outside it when q·m ≥ sin r·|m|, with |±e − ξc| = √(1 + ξ²). A circle of
 * radius R holds the cap when the angle to q is at most R − r and misses it beyond R + r. The margin makes a
 * wholly-inside or wholly-outside cell give the same answer the per-pixel test would for every member.
 */
function classifyCells(disc: DiscPixels, n: number, cellRadius: number, placed: PlacedFootprint, kinds: Uint8Array): void {
  if (!(cellRadius > 0)) {
    kinds.fill(MIXED, 0, n); // the cells are the map's own pixels: one test each anyway
    return;
  }
  const { z: zs, phi: phis } = disc;
  const [cx, cy, cz] = placed.centre;
  const { circle, cosRadius, tanHalfWidth: xi, tanHalfHeight: eta, east, north } = placed.test;
  const [ex, ey, ez] = east;
  const [nx, ny, nz] = north;
  const sinR = Math.sin(cellRadius);
  const kx = sinR * Math.sqrt(1 + xi * xi) + CLASSIFY_EPS;
  const ky = sinR * Math.sqrt(1 + eta * eta) + CLASSIFY_EPS;
  const kc = sinR + CLASSIFY_EPS;
  const radius = Math.acos(Math.max(-1, Math.min(1, cosRadius)));
  const cosIn = radius > cellRadius ? Math.cos(radius - cellRadius) + CLASSIFY_EPS : 2;
  const cosOut = Math.cos(Math.min(Math.PI, radius + cellRadius)) - CLASSIFY_EPS;
  for (let c = 0; c < n; c++) {
    const z = zs[c] ?? 0;
    const phi = phis[c] ?? 0;
    const s = Math.sqrt((1 - z) * (1 + z));
    const x = s * Math.cos(phi);
    const y = s * Math.sin(phi);
    const d = x * cx + y * cy + z * cz;
    if (circle) {
      kinds[c] = d < cosOut ? OUTSIDE : d >= cosIn ? INSIDE : MIXED;
      continue;
    }
    const a = Math.abs(x * ex + y * ey + z * ez) - xi * d;
    const b = Math.abs(x * nx + y * ny + z * nz) - eta * d;
    if (a >= kx || b >= ky || d <= -kc) kinds[c] = OUTSIDE;
    else if (a <= -kx && b <= -ky && d >= kc) kinds[c] = INSIDE;
    else kinds[c] = MIXED;
  }
}

/** Flat maps: cell c's pixels are pool entries cells[c] … cells[c] + span − 1. */
function scanRuns(centres: Float64Array, ids: Uint32Array, cells: Float64Array, kinds: Uint8Array, n: number, span: number, placed: PlacedFootprint, out: IndexList): void {
  const [cx, cy, cz] = placed.centre;
  const { circle, cosRadius, tanHalfWidth: xi, tanHalfHeight: eta, east, north } = placed.test;
  const [ex, ey, ez] = east;
  const [nx, ny, nz] = north;
  for (let c = 0; c < n; c++) {
    const kind = kinds[c] ?? MIXED;
    if (kind === OUTSIDE) continue;
    const from = cells[c] ?? 0;
    const to = from + span;
    if (kind === INSIDE) {
      for (let i = from; i < to; i++) appendIndex(out, ids[i] ?? 0);
      continue;
    }
    for (let i = from; i < to; i++) {
      const x = centres[3 * i] ?? 0;
      const y = centres[3 * i + 1] ?? 0;
      const z = centres[3 * i + 2] ?? 0;
      const d = x * cx + y * cy + z * cz;
      const inside = circle
        ? d >= cosRadius
        : d > 0 && Math.abs(x * ex + y * ey + z * ez) <= xi * d && Math.abs(x * nx + y * ny + z * nz) <= eta * d;
      if (inside) appendIndex(out, ids[i] ?? 0);
    }
  }
}

/** Multi-order maps: cell c's pixels are members[start[cells[c]]] … (footprint-pixels.ts's bucket index). */
function scanMembers(centres: Float64Array, start: Uint32Array, members: Uint32Array, cells: Float64Array, kinds: Uint8Array, n: number, placed: PlacedFootprint, out: IndexList): void {
  const [cx, cy, cz] = placed.centre;
  const { circle, cosRadius, tanHalfWidth: xi, tanHalfHeight: eta, east, north } = placed.test;
  const [ex, ey, ez] = east;
  const [nx, ny, nz] = north;
  for (let c = 0; c < n; c++) {
    const kind = kinds[c] ?? MIXED;
    if (kind === OUTSIDE) continue;
    const cell = cells[c] ?? 0;
    const to = start[cell + 1] ?? 0;
    if (kind === INSIDE) {
      for (let k = start[cell] ?? 0; k < to; k++) appendIndex(out, members[k] ?? 0);
      continue;
    }
    for (let k = start[cell] ?? 0; k < to; k++) {
      const i = members[k] ?? 0;
      const x = centres[3 * i] ?? 0;
      const y = centres[3 * i + 1] ?? 0;
      const z = centres[3 * i + 2] ?? 0;
      const d = x * cx + y * cy + z * cz;
      const inside = circle
        ? d >= cosRadius
        : d > 0 && Math.abs(x * ex + y * ey + z * ez) <= xi * d && Math.abs(x * nx + y * ny + z * nz) <= eta * d;
      if (inside) appendIndex(out, i);
    }
  }
}

/** A flat map's pixels by bucket cell, filled on first use: slot s holds pool entries s·span … (s + 1)·span − 1. */
class FlatCells {
  readonly span: number;
  centres = new Float64Array(0);
  ids = new Uint32Array(0);
  private readonly slotOf: Int32Array;
  private used = 0;
  private readonly scratch = new Float64Array(3);

  private readonly bucketNside: number;

  constructor(private readonly nside: number, levels: number, private readonly ring: boolean, order: number) {
    this.span = POW4[levels] ?? 1;
    this.bucketNside = 2 ** order;
    this.slotOf = new Int32Array(12 * (POW4[order] ?? 1)).fill(-1);
  }

  /** The cell (by RING index at the bucket order) filled if new; returns the pool index of its first pixel. */
  ensure(ringCell: number): number {
    const known = this.slotOf[ringCell] ?? -1;
    if (known >= 0) return known * this.span;
    const slot = this.used++;
    this.slotOf[ringCell] = slot;
    const cell = ringToNest(this.bucketNside, ringCell);
    const base = slot * this.span;
    if (base + this.span > this.ids.length) this.grow(base + this.span);
    const out = this.scratch;
    this.fill(cell, base, out);
    return base;
  }

  private fill(cell: number, base: number, out: Float64Array): void {
    for (let k = 0; k < this.span; k++) {
      const nest = cell * this.span + k;
      nestToRingCentre(this.nside, nest, out);
      const z = out[1] ?? 0;
      const phi = out[2] ?? 0;
      const s = Math.sqrt((1 - z) * (1 + z));
      const j = base + k;
      this.centres[3 * j] = s * Math.cos(phi);
      this.centres[3 * j + 1] = s * Math.sin(phi);
      this.centres[3 * j + 2] = z;
      this.ids[j] = this.ring ? (out[0] ?? 0) : nest;
    }
  }

  private grow(needed: number): void {
    const size = Math.max(needed, 2 * this.ids.length, 4096);
    const ids = new Uint32Array(size);
    ids.set(this.ids);
    const centres = new Float64Array(3 * size);
    centres.set(this.centres);
    this.ids = ids;
    this.centres = centres;
  }
}

const nestOfRingCache = new WeakMap<MultiOrderSkymap, Uint32Array>();

/** NESTED index of every cell at the map's bucket order, by RING index (built once per map). */
function nestOfRingCells(map: MultiOrderSkymap, order: number): Uint32Array {
  const cached = nestOfRingCache.get(map);
  if (cached) return cached;
  const nside = 2 ** order;
  const table = new Uint32Array(12 * nside * nside);
  for (let r = 0; r < table.length; r++) table[r] = ringToNest(nside, r);
  nestOfRingCache.set(map, table);
  return table;
}
