/**
 * Probability of astrophysical origin from network SNR ρ and false-alarm rate, the two-component Poisson mixture of
 * Farr, Gair, Mandel & Cutler 2015 (PRD 91, 023005) with the rates held at point values as Kapadia et al. 2020
 * (CQG 37, 045007) do for low latency: p = Λ₁ f(ρ) / (Λ₁ f(ρ) + Λ₀ b(ρ)).
 * - Astrophysical: Λ₁ f(ρ) = R · 3 ρ_th³ / ρ⁴ per year per unit SNR, the ρ⁻⁴ density of sources uniform in volume
 *   (Schutz 2011, CQG 28, 125023), R the expected rate of astrophysical triggers above ρ_th.
 * - Terrestrial: Λ₀ b(ρ) = −d FAR/dρ = ρ · FAR, the density of a background whose rate above ρ falls as
 *   exp(−ρ²/2), the tail of a phase-maximised matched-filter SNR in Gaussian noise (common practice; e.g.
 *   Allen et al. 2012, PRD 85, 122006, from memory). Real backgrounds with glitches fall more slowly.
 * byClass = pAstro × class probabilities (common practice), so it sums to pAstro.
 */
import type { ClassProbabilities } from "./source-class";
import { fail, succeed, type PhysicsResult } from "./result";

export interface AstroProbabilitySettings {
  /** expected astrophysical triggers per year above the SNR threshold */
  pAstroRatePerYear: number;
  pAstroSnrThreshold: number;
}

export interface AstroProbability {
  pAstro: number;
  pTerrestrial: number;
  byClass: ClassProbabilities | null;
  /** the inputs and settings it used, for the page */
  networkSnr: number;
  falseAlarmRatePerYear: number;
  ratePerYear: number;
  snrThreshold: number;
}

export function computeAstroProbability(
  networkSnr: number | undefined,
  falseAlarmRatePerYear: number | undefined,
  classes: ClassProbabilities | null,
  settings: AstroProbabilitySettings,
): PhysicsResult<AstroProbability> {
  if (typeof networkSnr !== "number" || !(networkSnr > 0) || !Number.isFinite(networkSnr)) {
    return fail("missing-input", "networkSnr is not a finite positive number");
  }
  if (typeof falseAlarmRatePerYear !== "number" || !(falseAlarmRatePerYear >= 0) || !Number.isFinite(falseAlarmRatePerYear)) {
    return fail("missing-input", "falseAlarmRatePerYear is not a finite number ≥ 0");
  }
  const { pAstroRatePerYear: rate, pAstroSnrThreshold: threshold } = settings;
  if (!(rate > 0) || !(threshold > 0)) return fail("invalid-settings", "pAstroRatePerYear and pAstroSnrThreshold must be positive");
  const astrophysical = (rate * 3 * threshold ** 3) / networkSnr ** 4;
  const terrestrial = networkSnr * falseAlarmRatePerYear;
  const pAstro = astrophysical / (astrophysical + terrestrial);
  const byClass = classes === null
    ? null
    : { bns: pAstro * classes.bns, nsbh: pAstro * classes.nsbh, bbh: pAstro * classes.bbh, lowerGap: pAstro * classes.lowerGap };
  return succeed({
    pAstro,
    pTerrestrial: terrestrial / (astrophysical + terrestrial),
    byClass,
    networkSnr,
    falseAlarmRatePerYear,
    ratePerYear: rate,
    snrThreshold: threshold,
  });
}

/** Binomial Monte Carlo standard error √(p (1 − p) / N) of each class probability from N samples. */
export function classStandardErrors(classes: ClassProbabilities, sampleCount: number): ClassProbabilities {
  const se = (p: number) => Math.sqrt((p * (1 - p)) / sampleCount);
  return { bns: se(classes.bns), nsbh: se(classes.nsbh), bbh: se(classes.bbh), lowerGap: se(classes.lowerGap) };
}
