import { SeededRandom } from "@/lib/physics/random";

/**
 * The fake feed's seeded source: the product's one seeded generator (xoshiro128**, lib/physics/random.ts) with the
 * helpers test data wants. Normals are Box–Muller (Box & Muller 1958) so a draw costs two uniforms, as it always has here.
 */
export class FeedRandom {
  private readonly source: SeededRandom;
  private spare: number | null = null;

  constructor(seed: string) {
    this.source = new SeededRandom(seed);
  }

  /** Uniform in [0, 1). */
  next(): number {
    return this.source.nextUint32() / 4294967296;
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
