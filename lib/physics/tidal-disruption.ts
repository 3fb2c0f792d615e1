/**
 * Baryon mass left outside the black hole after a neutron star–black hole merger, Foucart, Hinderer & Nissanke
 * 2018 (PRD 98, 081501(R); arXiv:1807.00011) Eq. 4 with α = 0.406, β = 0.139, γ = 0.255, δ = 1.761:
 * M̂_rem = [max(α(1 − 2C)/η^(1/3) − β R̂_isco C/η + γ, 0)]^δ. The exponent is δ, not 1 + δ (an issue asked for
 * 1 + δ). The paper's text could not be re-read here; evidence for δ: about ten independent open implementations
 * of the fit that cite Eq. 4 or the paper all raise the clipped bracket to δ = 1.761, and one's documented example
 * (5 M☉ non-spinning hole, 1.0 M☉ star of 15 km → 0.1227 M☉) is matched to 0.1 % by δ and missed by a factor ≈ 3.4
 * by 1 + δ (tests/physics/tidal-disruption.test.ts).
 * Masses in solar masses (source frame), radius in km.
 */
import { SUN_MASS_LENGTH_M } from "./constants";
import { iscoRadius } from "./kerr";

const ALPHA = 0.406;
const BETA = 0.139;
const GAMMA = 0.255;
const DELTA = 1.761;

/** Compactness C = G M / (R c²) of a neutron star (mass in M☉, radius in km). */
export function neutronStarCompactness(massSolar: number, radiusKm: number): number {
  return (massSolar * SUN_MASS_LENGTH_M) / (radiusKm * 1000);
}

/**
 * The bracket of FHN 2018 Eq. 4, α (1 − 2C)/η^(1/3) − β R̂_isco C/η + γ, given R̂_isco from BPT 1972 for the
 * black hole's aligned spin. Matter remains outside the hole exactly when this is positive.
 */
export function remnantBracket(etaSymmetric: number, compactness: number, bhIscoRadius: number): number {
  return (ALPHA * (1 - 2 * compactness)) / Math.cbrt(etaSymmetric) - (BETA * bhIscoRadius * compactness) / etaSymmetric + GAMMA;
}

/** M_rem / M_NS^baryonic = [max(bracket, 0)]^δ, FHN 2018 Eq. 4. */
export function remnantMassFraction(blackHoleMassSolar: number, neutronStarMassSolar: number, blackHoleSpin: number, radiusKm: number): number {
  const total = blackHoleMassSolar + neutronStarMassSolar;
  const eta = (blackHoleMassSolar * neutronStarMassSolar) / (total * total);
  const bracket = remnantBracket(eta, neutronStarCompactness(neutronStarMassSolar, radiusKm), iscoRadius(blackHoleSpin));
  return bracket > 0 ? bracket ** DELTA : 0;
}
