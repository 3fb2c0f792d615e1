/**
 * Deterministic random numbers: a string seed → 128-bit state → xoshiro128** 1.0 (Blackman & Vigna 2021,
 * ACM TOMS 47(4) 36), uniform deviates in (0, 1) and standard normals by the Box & Muller 1958 transform.
 */

/** FNV-1a 32-bit hash over UTF-16 code units (Fowler–Noll–Vo, common practice). */
function fnv1a32(text: string, basis: number): number {
  let hash = basis >>> 0;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 16777619);
  }
  return hash >>> 0;
}

/** One step of a 32-bit SplitMix-style sequence with a low-bias integer finaliser (common practice for seeding). */
function splitMix32(state: number): { state: number; output: number } {
  const next = (state + 0x9e3779b9) >>> 0;
  let z = next;
  z = Math.imul(z ^ (z >>> 16), 0x21f0aaad);
  z = Math.imul(z ^ (z >>> 15), 0x735a2d97);
  z ^= z >>> 15;
  return { state: next, output: z >>> 0 };
}

/** Four 32-bit state words from a string; two independent FNV lanes so seeds differ in 64 bits, never all zero. */
export function seedStateFromString(seed: string): [number, number, number, number] {
  let state = fnv1a32(seed, 0x811c9dc5);
  const second = fnv1a32(seed, 0x01000193 ^ seed.length);
  const words: number[] = [];
  for (let i = 0; i < 4; i++) {
    const step = splitMix32(i === 2 ? (state ^ second) >>> 0 : state);
    state = step.state;
    words.push(step.output);
  }
  if (!words.some((w) => w !== 0)) words[0] = 1;
  return [words[0] as number, words[1] as number, words[2] as number, words[3] as number];
}

export class SeededRandom {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  // A plain number plus a flag (not number | null) keeps the field an unboxed double in V8's hot loop.
  private spareNormal = 0;
  private hasSpare = false;

  /** A string seed is hashed; four explicit 32-bit words (not all zero) set the state directly. */
  constructor(seed: string | readonly [number, number, number, number]) {
    const state = typeof seed === "string" ? seedStateFromString(seed) : seed;
    [this.s0, this.s1, this.s2, this.s3] = state.map((word) => word | 0) as [number, number, number, number];
  }

  /** Next 32-bit output of xoshiro128** (Blackman & Vigna 2021). */
  nextUint32(): number {
    const s1 = this.s1;
    const product = Math.imul(s1, 5);
    const result = Math.imul((product << 7) | (product >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= this.s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = (this.s3 << 11) | (this.s3 >>> 21);
    return result;
  }

  /** Uniform deviate strictly inside (0, 1), resolution 2⁻³². */
  uniform(): number {
    return (this.nextUint32() + 0.5) / 4294967296;
  }

  /** Standard normal deviate, Box & Muller 1958 (both outputs of each pair are used). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spareNormal;
    }
    const radius = Math.sqrt(-2 * Math.log(this.uniform()));
    const angle = 2 * Math.PI * this.uniform();
    this.spareNormal = radius * Math.sin(angle);
    this.hasSpare = true;
    return radius * Math.cos(angle);
  }
}
