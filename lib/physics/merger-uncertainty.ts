/**
 * One-standard-deviation spreads of the merger figures from the component-mass sds, by first-order propagation
 * with central differences (step 10⁻⁴ of each mass): σ² = Σ (∂q/∂m_i σ_i)². Spins are point values and not varied.
 */
import { computeMergerFrequencies, type MergerFrequencies, type MergerFrequencyInput } from "./merger-frequencies";

export interface MergerSpreads {
  iscoHz: number;
  iscoKerrHz: number;
  ringdownHz: number | null;
  ringdownDampingTimeS: number | null;
  finalMassDetectorFrame: number;
  finalSpin: number;
}

type Picked = (m: MergerFrequencies) => number | null;

const picks: Record<keyof MergerSpreads, Picked> = {
  iscoHz: (m) => m.iscoHz,
  iscoKerrHz: (m) => m.iscoKerrHz,
  ringdownHz: (m) => m.ringdownHz,
  ringdownDampingTimeS: (m) => m.ringdownDampingTimeS,
  finalMassDetectorFrame: (m) => m.finalMass.detectorFrame,
  finalSpin: (m) => m.finalSpin,
};

export function mergerSpreads(input: MergerFrequencyInput, sd1: number, sd2: number): MergerSpreads | null {
  const shifted = (d1: number, d2: number) => {
    const result = computeMergerFrequencies({ ...input, mass1DetectorFrame: input.mass1DetectorFrame + d1, mass2DetectorFrame: input.mass2DetectorFrame + d2 });
    return result.ok ? result.value : null;
  };
  const h1 = 1e-4 * input.mass1DetectorFrame;
  const h2 = 1e-4 * input.mass2DetectorFrame;
  const at = [shifted(h1, 0), shifted(-h1, 0), shifted(0, h2), shifted(0, -h2)];
  if (at.some((m) => m === null)) return null;
  const [p1, n1, p2, n2] = at as MergerFrequencies[];
  const spread = (pick: Picked): number | null => {
    const values = [pick(p1 as MergerFrequencies), pick(n1 as MergerFrequencies), pick(p2 as MergerFrequencies), pick(n2 as MergerFrequencies)];
    if (values.some((v) => v === null)) return null;
    const [a, b, c, d] = values as number[];
    return Math.hypot((((a as number) - (b as number)) / (2 * h1)) * sd1, (((c as number) - (d as number)) / (2 * h2)) * sd2);
  };
  return {
    iscoHz: spread(picks.iscoHz) ?? 0,
    iscoKerrHz: spread(picks.iscoKerrHz) ?? 0,
    ringdownHz: spread(picks.ringdownHz),
    ringdownDampingTimeS: spread(picks.ringdownDampingTimeS),
    finalMassDetectorFrame: spread(picks.finalMassDetectorFrame) ?? 0,
    finalSpin: spread(picks.finalSpin) ?? 0,
  };
}
