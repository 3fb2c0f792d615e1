/**
 * Deterministic random numbers: a string seed → 128-bit state → xoshiro128** 1.0 (Blackman & Vigna 2021,
 * ACM TOMS 47(4) 36), uniform deviates in (0, 1), and standard normals by the ziggurat method of Marsaglia &
 * Tsang 2000 (J. Stat. Softw. 5(8)) with 128 layers. As Doornik 2005 ("An improved ziggurat method to generate
 * normal random samples") recommends, the layer index and the value come from different bits of the draw.
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

  /**
   * Standard normal deviate, ziggurat method (Marsaglia & Tsang 2000). One 32-bit draw: the low 7 bits pick the
   * layer, the high 25 bits (signed) give the abscissa; about 99 % of calls return from the first test.
   */
  normal(): number {
    const bits = this.nextUint32();
    const layer = bits & 127;
    const signed = (bits | 0) >> 7;
    if (Math.abs(signed) < (zigguratK[layer] as number)) return signed * (zigguratW[layer] as number);
    return this.normalSlow(signed, layer);
  }

  /** The ziggurat's wedge and tail steps (Marsaglia & Tsang 2000, the `nfix` routine). */
  private normalSlow(signed: number, layer: number): number {
    for (;;) {
      const x = signed * (zigguratW[layer] as number);
      if (layer === 0) {
        // Tail beyond r: Marsaglia 1964's method.
        let tailX: number;
        let tailY: number;
        do {
          tailX = -Math.log(this.uniform()) / ZIGGURAT_R;
          tailY = -Math.log(this.uniform());
        } while (tailY + tailY < tailX * tailX);
        return signed > 0 ? ZIGGURAT_R + tailX : -ZIGGURAT_R - tailX;
      }
      const below = zigguratF[layer] as number;
      const above = zigguratF[layer - 1] as number;
      if (below + this.uniform() * (above - below) < Math.exp(-0.5 * x * x)) return x;
      const bits = this.nextUint32();
      layer = bits & 127;
      signed = (bits | 0) >> 7;
      if (Math.abs(signed) < (zigguratK[layer] as number)) return signed * (zigguratW[layer] as number);
    }
  }
}

/** Start of the tail and area of each of the 128 layers for the normal density (Marsaglia & Tsang 2000). */
const ZIGGURAT_R = 3.442619855899;
const ZIGGURAT_V = 9.91256303526217e-3;

/** Layer tables (`kn`, `wn`, `fn` of Marsaglia & Tsang's `zigset`), scaled for a 25-bit signed abscissa. */
const { zigguratK, zigguratW, zigguratF } = (() => {
  const scale = 2 ** 24;
  const k = new Float64Array(128);
  const w = new Float64Array(128);
  const f = new Float64Array(128);
  let d = ZIGGURAT_R;
  let t = d;
  const q = ZIGGURAT_V / Math.exp(-0.5 * d * d);
  k[0] = (d / q) * scale;
  k[1] = 0;
  w[0] = q / scale;
  w[127] = d / scale;
  f[0] = 1;
  f[127] = Math.exp(-0.5 * d * d);
  for (let i = 126; i >= 1; i--) {
    d = Math.sqrt(-2 * Math.log(ZIGGURAT_V / d + Math.exp(-0.5 * d * d)));
    k[i + 1] = (d / t) * scale;
    t = d;
    f[i] = Math.exp(-0.5 * d * d);
    w[i] = d / scale;
  }
  return { zigguratK: k, zigguratW: w, zigguratF: f };
})();
