import { fineNestedIndex } from "@/lib/skymap/pixel-at";

/**
 * Packing galaxies per index cell for the ranking index (db/schema/galaxies.ts, `galaxy_cells`): records of four
 * float64s (id, fine NESTED index at order 15, distanceMpc, weight), little-endian whatever the machine. The fine
 * index finds the galaxy's pixel in any map without trigonometry; positions and names stay in `galaxies`.
 */
export const PACK_FIELDS = 4;

export interface CellPack {
  cell: number;
  count: number;
  data: Uint8Array;
}

/** Galaxies as parallel columns: how ranking reads a region (no object per galaxy). */
export interface GalaxyColumns {
  count: number;
  id: Float64Array;
  /** NESTED index at FINE_INDEX_ORDER (lib/skymap/pixel-at.ts) */
  fine: Float64Array;
  distanceMpc: Float64Array;
  weight: Float64Array;
}

/** Collects galaxies per cell until `drain()`, which hands over one pack per cell seen since the last drain. */
export class CellPacker {
  private cells = new Map<number, number[]>();
  private held = 0;

  add(cell: number, id: number, fine: number, distanceMpc: number, weight: number): void {
    let list = this.cells.get(cell);
    if (!list) this.cells.set(cell, (list = []));
    list.push(id, fine, distanceMpc, weight);
    this.held += 1;
  }

  /** Galaxies held since the last drain. */
  get size(): number {
    return this.held;
  }

  drain(): CellPack[] {
    const out: CellPack[] = [];
    for (const [cell, values] of [...this.cells].sort((a, b) => a[0] - b[0])) {
      const data = new Uint8Array(values.length * 8);
      const view = new DataView(data.buffer);
      for (let k = 0; k < values.length; k++) view.setFloat64(k * 8, values[k] ?? 0, true);
      out.push({ cell, count: values.length / PACK_FIELDS, data });
    }
    this.cells = new Map();
    this.held = 0;
    return out;
  }
}

const littleEndian = new Uint8Array(new Float64Array([1]).buffer)[7] === 0x3f;

/** The galaxies of several packs as columns, in pack order. */
export function unpack(packs: ReadonlyArray<{ count: number; data: Uint8Array }>): GalaxyColumns {
  const count = packs.reduce((n, p) => n + p.count, 0);
  const cols = { count, id: new Float64Array(count), fine: new Float64Array(count), distanceMpc: new Float64Array(count), weight: new Float64Array(count) };
  let at = 0;
  for (const pack of packs) {
    const values = pack.count * PACK_FIELDS;
    if (pack.data.byteLength !== values * 8) throw new Error(`a galaxy pack of ${pack.count} holds ${pack.data.byteLength} bytes`);
    // one aligned copy per pack (a blob need not start on an 8-byte boundary), then strided reads
    let f: Float64Array;
    if (littleEndian) {
      f = new Float64Array(values);
      new Uint8Array(f.buffer).set(pack.data);
    } else {
      const view = new DataView(pack.data.buffer, pack.data.byteOffset, pack.data.byteLength);
      f = Float64Array.from({ length: values }, (_, k) => view.getFloat64(k * 8, true));
    }
    for (let k = 0, o = 0; k < pack.count; k++, at++, o += PACK_FIELDS) {
      cols.id[at] = f[o] ?? 0;
      cols.fine[at] = f[o + 1] ?? 0;
      cols.distanceMpc[at] = f[o + 2] ?? 0;
      cols.weight[at] = f[o + 3] ?? 0;
    }
  }
  return cols;
}

/** Columns from galaxy objects (tests, the demo seed). */
export function toColumns(galaxies: ReadonlyArray<{ raDeg: number; decDeg: number; distanceMpc: number; weight: number }>, ids?: ArrayLike<number>): GalaxyColumns {
  const n = galaxies.length;
  const cols = { count: n, id: new Float64Array(n), fine: new Float64Array(n), distanceMpc: new Float64Array(n), weight: new Float64Array(n) };
  galaxies.forEach((g, k) => {
    cols.id[k] = ids ? (ids[k] ?? k) : k;
    cols.fine[k] = fineNestedIndex(g.raDeg, g.decDeg);
    cols.distanceMpc[k] = g.distanceMpc;
    cols.weight[k] = g.weight;
  });
  return cols;
}
