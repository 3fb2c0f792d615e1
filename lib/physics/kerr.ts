/**
 * Circular equatorial orbits of a Kerr black hole (Bardeen, Press & Teukolsky 1972, ApJ 178, 347).
 * Spins are dimensionless and signed along the orbital angular momentum (χ > 0 prograde); radii in units of GM/c².
 */
import { SUN_MASS_TIME_S } from "./constants";

/** ISCO radius r/M for signed spin χ ∈ [−1, 1]: BPT 1972 Eq. 2.21 (upper sign prograde). */
export function iscoRadius(chi: number): number {
  const z1 = 1 + Math.cbrt(1 - chi * chi) * (Math.cbrt(1 + chi) + Math.cbrt(1 - chi));
  const z2 = Math.sqrt(3 * chi * chi + z1 * z1);
  return 3 + z2 - Math.sign(chi) * Math.sqrt((3 - z1) * (3 + z1 + 2 * z2));
}

/** Specific orbital energy at the ISCO, E/μ = √(1 − 2/(3 r_isco)): BPT 1972 Eq. 2.12 evaluated at r_ms. */
export function iscoSpecificEnergy(chi: number): number {
  return Math.sqrt(1 - 2 / (3 * iscoRadius(chi)));
}

/**
 * GW frequency (Hz, twice the orbital) at the ISCO of a Kerr black hole of mass massSolar in the frame of the mass:
 * Ω = c³ / (G M (r^(3/2) + χ)), BPT 1972 Eq. 2.16; f_GW = Ω/π.
 */
export function iscoGravitationalWaveFrequencyHz(massSolar: number, chi: number): number {
  const r = iscoRadius(chi);
  return 1 / (Math.PI * SUN_MASS_TIME_S * massSolar * (r * Math.sqrt(r) + chi));
}

/** Schwarzschild ISCO GW frequency c³ / (6^(3/2) π G M) ≈ 4.4 kHz (M☉/M), Maggiore 2008 (Gravitational Waves Vol. 1) §4.1. */
export function schwarzschildIscoFrequencyHz(massSolar: number): number {
  return iscoGravitationalWaveFrequencyHz(massSolar, 0);
}
