/**
 * Remnant of an aligned-spin black-hole binary and its dominant ringdown mode.
 * Final spin: Barausse & Rezzolla 2009 (ApJ 704, L40) formula restricted to aligned spins; its coefficients s4, s5,
 * t0, t2, t3 are that paper's (an earlier, differently fitted form is Rezzolla et al. 2008, ApJ 674, L29).
 * Radiated energy: Barausse, Morozova & Rezzolla 2012 (ApJ 758, 63).
 * Ringdown: Berti, Cardoso & Will 2006 (PRD 73, 064030) Table VIII, l = m = 2, n = 0.
 * Masses in solar masses (any one frame, consistently), spins dimensionless and signed along L.
 */
import { SUN_MASS_TIME_S } from "./constants";
import { iscoSpecificEnergy } from "./kerr";
import { fail, succeed, type PhysicsResult } from "./result";

// Barausse & Rezzolla 2009 coefficients (from memory; equal-mass non-spinning gives 0.6865).
const S4 = -0.1229;
const S5 = 0.4537;
const T0 = -2.8904;
const T2 = -3.5171;
const T3 = 2.5763;
// Barausse, Morozova & Rezzolla 2012 coefficients (from memory; p0 is the equal-mass non-spinning E_rad/M).
const P0 = 0.04827;
const P1 = 0.01707;
// Berti, Cardoso & Will 2006 Table VIII, (l, m, n) = (2, 2, 0) (from memory).
const F1 = 1.5251;
const F2 = -1.1568;
const F3 = 0.1292;
const Q1 = 0.7;
const Q2 = 1.4187;
const Q3 = -0.499;
/** Thorne 1974 (ApJ 191, 507) limiting spin of an accreting hole; remnant spins are clamped to ±this. */
export const MAX_REMNANT_SPIN = 0.998;

interface OrderedBinary {
  q: number;
  eta: number;
  chiHeavy: number;
  chiLight: number;
}

function order(mass1: number, mass2: number, chi1: number, chi2: number): OrderedBinary {
  const heavyFirst = mass1 >= mass2;
  const q = heavyFirst ? mass2 / mass1 : mass1 / mass2;
  return {
    q,
    eta: q / (1 + q) ** 2,
    chiHeavy: heavyFirst ? chi1 : chi2,
    chiLight: heavyFirst ? chi2 : chi1,
  };
}

/** Final dimensionless spin, Barausse & Rezzolla 2009 formula for aligned spins (ã = (χ1 + χ2 q²)/(1 + q²), q = m_light/m_heavy ≤ 1). */
export function finalSpinAligned(mass1: number, mass2: number, chi1: number, chi2: number): number {
  const { q, eta, chiHeavy, chiLight } = order(mass1, mass2, chi1, chi2);
  const aTilde = (chiHeavy + chiLight * q * q) / (1 + q * q);
  const spin = aTilde + aTilde * eta * (S4 * aTilde + S5 * eta + T0) + eta * (2 * Math.sqrt(3) + T2 * eta + T3 * eta * eta);
  return Math.min(MAX_REMNANT_SPIN, Math.max(-MAX_REMNANT_SPIN, spin));
}

/**
 * Radiated energy as a fraction of the total mass, Barausse, Morozova & Rezzolla 2012:
 * E/M = [1 − Ẽ_isco(ã)] η + 4η² [4 p0 + 16 p1 ã (ã + 1) + Ẽ_isco(ã) − 1], ã = (χ1 + χ2 q²)/(1 + q)².
 */
export function radiatedEnergyFraction(mass1: number, mass2: number, chi1: number, chi2: number): number {
  const { q, eta, chiHeavy, chiLight } = order(mass1, mass2, chi1, chi2);
  const aTilde = (chiHeavy + chiLight * q * q) / (1 + q) ** 2;
  const energy = iscoSpecificEnergy(aTilde);
  return (1 - energy) * eta + 4 * eta * eta * (4 * P0 + 16 * P1 * aTilde * (aTilde + 1) + energy - 1);
}

export interface RingdownMode {
  frequencyHz: number;
  dampingTimeS: number;
  qualityFactor: number;
}

/**
 * l = m = 2, n = 0 quasinormal mode of a Kerr hole (mass in solar masses, spin 0 ≤ j < 1), Berti, Cardoso &
 * Will 2006 Table VIII fit: M ω_R = f1 + f2 (1 − j)^f3, Q = ω_R / (2 ω_I) = q1 + q2 (1 − j)^q3.
 */
export function ringdownMode(finalMassSolar: number, finalSpin: number): PhysicsResult<RingdownMode> {
  if (!(finalSpin >= 0 && finalSpin < 1)) {
    return fail("spin-outside-fit", `final spin ${finalSpin.toFixed(3)} is outside the co-rotating fit range 0 ≤ j < 1`);
  }
  const omegaDimensionless = F1 + F2 * (1 - finalSpin) ** F3;
  const qualityFactor = Q1 + Q2 * (1 - finalSpin) ** Q3;
  const omegaRadPerS = omegaDimensionless / (SUN_MASS_TIME_S * finalMassSolar);
  return succeed({
    frequencyHz: omegaRadPerS / (2 * Math.PI),
    dampingTimeS: (2 * qualityFactor) / omegaRadPerS,
    qualityFactor,
  });
}
