/**
 * Expected merger frequencies from component masses and aligned spins, in the detector frame (what the detectors
 * see): frequencies computed from detector-frame masses already carry the (1 + z) redshift.
 * Sources: BPT 1972 ISCO; Barausse & Rezzolla 2009 final spin; Barausse, Morozova & Rezzolla 2012 radiated energy;
 * Berti, Cardoso & Will 2006 quasinormal-mode fit. See kerr.ts and remnant.ts.
 */
import { iscoGravitationalWaveFrequencyHz, schwarzschildIscoFrequencyHz } from "./kerr";
import type { MergerSpreads } from "./merger-uncertainty";
import { finalSpinAligned, radiatedEnergyFraction, ringdownMode } from "./remnant";
import { describeFailure, fail, succeed, type PhysicsResult } from "./result";

export interface FramedMass {
  detectorFrame: number;
  /** null when no redshift is known. */
  sourceFrame: number | null;
}

export interface MergerFrequencies {
  totalMass: FramedMass;
  finalMass: FramedMass;
  finalSpin: number;
  radiatedEnergyFraction: number;
  /** GW frequency at the Schwarzschild ISCO of the total detector-frame mass (Hz). */
  iscoHz: number;
  /** GW frequency at the Kerr ISCO of the remnant (final detector-frame mass and signed final spin: prograde for a spin ≥ 0, retrograde below), Hz. */
  iscoKerrHz: number;
  ringdownHz: number | null;
  ringdownDampingTimeS: number | null;
  ringdownQualityFactor: number | null;
  ringdownError: string | null;
  /** true when no spins were given and χ1 = χ2 = 0 was used. */
  spinsAssumed: boolean;
  /** 1σ spreads from the component-mass sds (merger-uncertainty.ts); null when they could not be propagated */
  sd?: MergerSpreads | null;
  /** set for a neutron-star pair: the black-hole remnant and ringdown apply only if a black hole forms */
  remnantNote?: string | null;
}

export interface MergerFrequencyInput {
  mass1DetectorFrame: number;
  mass2DetectorFrame: number;
  chi1: number;
  chi2: number;
  spinsAssumed: boolean;
  redshift: number | null;
}

/** ISCO, remnant and ringdown figures (Hz, s, M☉ detector frame) for the mean masses; sources in the module comment. */
export function computeMergerFrequencies(input: MergerFrequencyInput): PhysicsResult<MergerFrequencies> {
  const { mass1DetectorFrame: m1, mass2DetectorFrame: m2, chi1, chi2, redshift } = input;
  if (!(m1 > 0) || !(m2 > 0) || !Number.isFinite(m1) || !Number.isFinite(m2)) {
    return fail("invalid-mass", "component masses must be finite and positive");
  }
  if (!(Math.abs(chi1) <= 1) || !(Math.abs(chi2) <= 1)) return fail("invalid-spin", "spins must lie in [−1, 1]");
  const totalDetector = m1 + m2;
  const finalSpin = finalSpinAligned(m1, m2, chi1, chi2);
  const radiated = radiatedEnergyFraction(m1, m2, chi1, chi2);
  const finalDetector = totalDetector * (1 - radiated);
  const toSource = (mass: number) => (redshift === null ? null : mass / (1 + redshift));
  const ringdown = ringdownMode(finalDetector, finalSpin);
  return succeed({
    totalMass: { detectorFrame: totalDetector, sourceFrame: toSource(totalDetector) },
    finalMass: { detectorFrame: finalDetector, sourceFrame: toSource(finalDetector) },
    finalSpin,
    radiatedEnergyFraction: radiated,
    iscoHz: schwarzschildIscoFrequencyHz(totalDetector),
    iscoKerrHz: iscoGravitationalWaveFrequencyHz(finalDetector, finalSpin),
    ringdownHz: ringdown.ok ? ringdown.value.frequencyHz : null,
    ringdownDampingTimeS: ringdown.ok ? ringdown.value.dampingTimeS : null,
    ringdownQualityFactor: ringdown.ok ? ringdown.value.qualityFactor : null,
    ringdownError: ringdown.ok ? null : describeFailure(ringdown),
    spinsAssumed: input.spinsAssumed,
  });
}
