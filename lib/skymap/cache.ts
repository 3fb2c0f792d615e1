import type { SkymapMap } from "./types";

/**
 * A small least-recently-used cache of parsed maps keyed by content hash, so cone queries can re-read
 * the stored FITS file at native resolution without re-parsing it on every request. Pure: the caller
 * supplies the loader (e.g. read data/<sha256> and run loadSkymap).
 */
export class SkymapCache {
  private readonly entries = new Map<string, { map: SkymapMap; bytes: number }>();
  private totalBytes = 0;

  constructor(private readonly maxBytes = 256 * 1024 * 1024) {}

  get(key: string, load: () => SkymapMap): SkymapMap {
    const hit = this.entries.get(key);
    if (hit) {
      this.entries.delete(key); // re-insert: Map keeps insertion order, oldest first
      this.entries.set(key, hit);
      return hit.map;
    }
    const map = load();
    const bytes = mapBytes(map);
    this.entries.set(key, { map, bytes });
    this.totalBytes += bytes;
    for (const [oldKey, entry] of this.entries) {
      if (this.totalBytes <= this.maxBytes || oldKey === key) break;
      this.entries.delete(oldKey);
      this.totalBytes -= entry.bytes;
    }
    return map;
  }

  get size(): number {
    return this.entries.size;
  }
}

function mapBytes(map: SkymapMap): number {
  const distanceBytes = map.distance ? 3 * map.probability.byteLength : 0;
  if (map.layout !== "multiorder") return map.probability.byteLength + distanceBytes;
  // order, ipix, probability, density, and the pixel centres built by the first cone query
  return map.order.length * (1 + 8 * 3 + 24) + distanceBytes;
}
