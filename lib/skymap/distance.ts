import { inverseMillsRatio, normalCdf } from "./normal";

/**
 * The 3D localisation ansatz of Singer et al. 2016 (ApJL 829 L15, eq. 1; ApJS 226 10, §2.2):
 * p(r | n) = DISTNORM(n) · r² · N(r; DISTMU(n), DISTSIGMA(n)) for r > 0. DISTMU and DISTSIGMA are the ansatz's
 * location and scale, not the distance's own mean and spread; the moments below convert them.
 */

/** Per-pixel ansatz columns, parallel to the map's probability array; units Mpc, Mpc and Mpc⁻². */
export interface DistanceLayers {
  muMpc: Float64Array;
  sigmaMpc: Float64Array;
  normPerMpc2: Float64Array;
}

export interface DistanceMoments {
  meanMpc: number;
  stdMpc: number;
}

/**
 * L_n = ∫₀^∞ tⁿ φ(t − x) dt / Φ(x), x = μ/σ, in units of σ: L₀ = 1, L₁ = x + φ(x)/Φ(x) and, integrating by parts,
 * L_n = x·L_{n−1} + (n − 1)·L_{n−2}. Dividing by Φ(x) keeps every term finite for |x| in the hundreds.
 */
function truncatedMoments(x: number): [number, number, number, number, number] {
  const l0 = 1;
  const l1 = x + inverseMillsRatio(x);
  const l2 = x * l1 + l0;
  const l3 = x * l2 + 2 * l1;
  const l4 = x * l3 + 3 * l2;
  return [l0, l1, l2, l3, l4];
}

/** True when a pixel holds usable distance information (files write DISTMU = ∞ or DISTNORM = 0 where it has none). */
export function hasAnsatz(muMpc: number, sigmaMpc: number, normPerMpc2: number): boolean {
  return Number.isFinite(muMpc) && Number.isFinite(sigmaMpc) && sigmaMpc > 0 && Number.isFinite(normPerMpc2) && normPerMpc2 > 0;
}

/**
 * Mean and standard deviation of r under r²·N(r; μ, σ) on r > 0 (Singer et al. 2016, ApJS 226 10, §2.2 gives the
 * same moments in closed form): mean = σ·L₃/L₂, E[r²] = σ²·L₄/L₂. Null when the pixel has no distance.
 */
export function ansatzMoments(muMpc: number, sigmaMpc: number): DistanceMoments | null {
  if (!hasAnsatz(muMpc, sigmaMpc, 1)) return null;
  const [, , l2, l3, l4] = truncatedMoments(muMpc / sigmaMpc);
  const mean = l3 / l2;
  const variance = Math.max(0, l4 / l2 - mean * mean);
  return { meanMpc: sigmaMpc * mean, stdMpc: sigmaMpc * Math.sqrt(variance) };
}

/** The DISTNORM a pixel's μ and σ imply: 1 / ∫₀^∞ r² N(r; μ, σ) dr = 1 / (σ² · Φ(μ/σ) · L₂), in Mpc⁻². */
export function ansatzNorm(muMpc: number, sigmaMpc: number): number {
  const x = muMpc / sigmaMpc;
  return 1 / (sigmaMpc * sigmaMpc * normalCdf(x) * truncatedMoments(x)[2]);
}

/** N(r; μ, σ), the normal density in r, per Mpc. */
export function normalDensityPerMpc(rMpc: number, muMpc: number, sigmaMpc: number): number {
  const u = (rMpc - muMpc) / sigmaMpc;
  return Math.exp(-0.5 * u * u) / (sigmaMpc * Math.sqrt(2 * Math.PI));
}

export interface MapDistance extends DistanceMoments {
  /** Share of the sky probability in pixels that carry distance information. */
  coveredProbability: number;
}

/**
 * Distance over the whole map: the marginal p(r) = Σᵢ Pᵢ · p(r | nᵢ) is a mixture, so its mean is Σ Pᵢ·meanᵢ and its
 * second moment Σ Pᵢ·(stdᵢ² + meanᵢ²), over pixels with distance information, renormalised by their probability.
 */
export function mapDistance(probability: Float64Array, layers: DistanceLayers): MapDistance | null {
  let covered = 0;
  let first = 0;
  let second = 0;
  for (let i = 0; i < probability.length; i++) {
    const p = probability[i] ?? 0;
    if (!(p > 0)) continue;
    const mu = layers.muMpc[i] ?? Number.NaN;
    const sigma = layers.sigmaMpc[i] ?? Number.NaN;
    if (!hasAnsatz(mu, sigma, layers.normPerMpc2[i] ?? 0)) continue;
    const moments = ansatzMoments(mu, sigma);
    if (!moments) continue;
    covered += p;
    first += p * moments.meanMpc;
    second += p * (moments.stdMpc ** 2 + moments.meanMpc ** 2);
  }
  if (!(covered > 0)) return null;
  const meanMpc = first / covered;
  return { meanMpc, stdMpc: Math.sqrt(Math.max(0, second / covered - meanMpc * meanMpc)), coveredProbability: covered };
}

/** The moments of one pixel of a map, or null when it carries no distance. */
export function pixelDistance(layers: DistanceLayers, index: number): DistanceMoments | null {
  const mu = layers.muMpc[index] ?? Number.NaN;
  const sigma = layers.sigmaMpc[index] ?? Number.NaN;
  if (!hasAnsatz(mu, sigma, layers.normPerMpc2[index] ?? 0)) return null;
  return ansatzMoments(mu, sigma);
}
