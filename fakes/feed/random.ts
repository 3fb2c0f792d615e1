/**
 * The fake feed's own seeded generator: mulberry32 (a public-domain 32-bit generator, common practice for
 * test data) seeded by an FNV-1a hash of a string, with Box–Muller normals (Box & Muller 1958).
 */
export class FeedRandom {
  private state: number;
  private spare: number | null = null;

  constructor(seed: string) {
    let hash = 0x811c9dc5;
    for (let i = 0; i < seed.length; i++) hash = Math.imul(hash ^ seed.charCodeAt(i), 16777619);
    this.state = hash >>> 0;
  }

  /** Uniform in [0, 1). */
  next(): number {
    this.state = (this.state + 0x6d2b79f5) >>> 0;
    let t = this.state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  uniform(low: number, high: number): number {
    return low + (high - low) * this.next();
  }

  int(lowInclusive: number, highInclusive: number): number {
    return lowInclusive + Math.floor(this.next() * (highInclusive - lowInclusive + 1));
  }

  chance(probability: number): boolean {
    return this.next() < probability;
  }

  pick<T>(items: readonly T[]): T {
    const item = items[Math.floor(this.next() * items.length)];
    if (item === undefined) throw new Error("pick from an empty list");
    return item;
  }

  normal(mean = 0, sd = 1): number {
    if (this.spare !== null) {
      const z = this.spare;
      this.spare = null;
      return mean + sd * z;
    }
    const u = 1 - this.next();
    const v = this.next();
    const radius = Math.sqrt(-2 * Math.log(u));
    this.spare = radius * Math.sin(2 * Math.PI * v);
    return mean + sd * radius * Math.cos(2 * Math.PI * v);
  }

  /** A normal draw clipped into [low, high] (redrawn a few times, then clamped). */
  normalWithin(mean: number, sd: number, low: number, high: number): number {
    for (let attempt = 0; attempt < 8; attempt++) {
      const x = this.normal(mean, sd);
      if (x >= low && x <= high) return x;
    }
    return Math.min(high, Math.max(low, mean));
  }
}

export function round(value: number, decimals: number): number {
  const scale = 10 ** decimals;
  return Math.round(value * scale) / scale;
}
