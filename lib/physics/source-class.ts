/**
 * Source-class probabilities by Monte Carlo over Gaussian component masses (detector frame) and luminosity
 * distance, converted to source-frame masses m/(1 + z) with Planck 2018 flat ΛCDM. Class boundaries (defaults
 * 3 and 5 M☉) are common practice. Remnant matter for NS–BH samples: Foucart, Hinderer & Nissanke 2018 Eq. 4 with
 * the Bardeen, Press & Teukolsky 1972 prograde ISCO.
 */
import { planck18DistanceTable } from "./distance-table";
import { iscoRadius } from "./kerr";
import { SeededRandom } from "./random";
import { fail, succeed, type PhysicsResult } from "./result";
import { neutronStarCompactness, remnantBracket } from "./tidal-disruption";

export interface GaussianEstimate {
  mean: number;
  sd: number;
}

export interface SourceClassInput {
  mass1DetectorFrame: GaussianEstimate;
  mass2DetectorFrame: GaussianEstimate;
  chi1: number;
  chi2: number;
  distanceMpc: GaussianEstimate | null;
}

export interface SourceClassSettings {
  nsMaxMassSolar: number;
  gapUpperMassSolar: number;
  nsRadiusKm: number;
  sampleCount: number;
}

export interface ClassProbabilities {
  bns: number;
  nsbh: number;
  bbh: number;
  lowerGap: number;
}

export interface SourceClassResult {
  classProbabilities: ClassProbabilities;
  pNeutronStar: number;
  pRemnantMatter: number;
  sampleCount: number;
}

export const MAX_SAMPLE_COUNT = 1_000_000;
/** Redraws allowed per accepted sample before giving up (truncated normals with mean > 0 accept ≥ half the time). */
const MAX_DRAWS_PER_SAMPLE = 64;

function isGaussian(value: GaussianEstimate | null | undefined): value is GaussianEstimate {
  return value !== null && value !== undefined && Number.isFinite(value.mean) && Number.isFinite(value.sd) && value.mean > 0 && value.sd >= 0;
}

export function validateSourceClassSettings(settings: SourceClassSettings): PhysicsResult<null> {
  const { nsMaxMassSolar, gapUpperMassSolar, nsRadiusKm, sampleCount } = settings;
  if (!(nsMaxMassSolar > 0) || !Number.isFinite(nsMaxMassSolar)) return fail("invalid-settings", "nsMaxMassSolar must be positive");
  if (!(gapUpperMassSolar >= nsMaxMassSolar) || !Number.isFinite(gapUpperMassSolar)) {
    return fail("invalid-settings", "gapUpperMassSolar must be finite and ≥ nsMaxMassSolar");
  }
  if (!(nsRadiusKm > 0) || !Number.isFinite(nsRadiusKm)) return fail("invalid-settings", "nsRadiusKm must be positive");
  if (!Number.isInteger(sampleCount) || sampleCount < 1 || sampleCount > MAX_SAMPLE_COUNT) {
    return fail("invalid-settings", `sampleCount must be an integer in [1, ${MAX_SAMPLE_COUNT}]`);
  }
  return succeed(null);
}

function exhausted(): PhysicsResult<never> {
  return fail("sampling-exhausted", "too many rejected draws (distribution mostly outside the allowed range)");
}

/**
 * Class probabilities, P(NS) and P(matter outside the hole) from `settings.sampleCount` seeded draws; masses in M☉
 * (detector frame in, source frame m/(1+z) for the thresholds), distance in Mpc. Sources: see the module comment.
 */
export function computeSourceClasses(
  input: SourceClassInput,
  settings: SourceClassSettings,
  seed: string,
): PhysicsResult<SourceClassResult> {
  const settingsCheck = validateSourceClassSettings(settings);
  if (!settingsCheck.ok) return settingsCheck;
  if (!isGaussian(input.mass1DetectorFrame) || !isGaussian(input.mass2DetectorFrame)) {
    return fail("invalid-mass", "each mass needs a finite mean > 0 and a finite sd ≥ 0");
  }
  if (!(Math.abs(input.chi1) <= 1) || !(Math.abs(input.chi2) <= 1)) return fail("invalid-spin", "spins must lie in [−1, 1]");
  const distance = input.distanceMpc;
  // Built on first use only (a few ms), so distance-free callers never pay for it.
  const table = distance === null ? null : planck18DistanceTable();
  if (distance !== null && table !== null) {
    if (!isGaussian(distance)) return fail("invalid-distance", "distance needs a finite mean > 0 and a finite sd ≥ 0");
    if (distance.mean > table.maxLuminosityDistanceMpc) {
      return fail("distance-out-of-range", `mean distance beyond ${Math.round(table.maxLuminosityDistanceMpc)} Mpc (z > ${table.maxRedshift})`);
    }
  }

  const { nsMaxMassSolar, gapUpperMassSolar, nsRadiusKm, sampleCount } = settings;
  const random = new SeededRandom(seed);
  const maxDraws = MAX_DRAWS_PER_SAMPLE * sampleCount;
  let draws = 0;
  // Plain locals in the hot loop (about 6·10⁴ draws per trigger).
  const mean1 = input.mass1DetectorFrame.mean;
  const sd1 = input.mass1DetectorFrame.sd;
  const mean2 = input.mass2DetectorFrame.mean;
  const sd2 = input.mass2DetectorFrame.sd;
  const distanceMean = distance?.mean ?? 0;
  const distanceSd = distance?.sd ?? 0;
  const maxDistance = table?.maxLuminosityDistanceMpc ?? 0;
  const iscoRadius1 = iscoRadius(input.chi1);
  const iscoRadius2 = iscoRadius(input.chi2);
  let bns = 0;
  let nsbh = 0;
  let bbh = 0;
  let lowerGap = 0;
  let neutronStar = 0;
  let remnantMatter = 0;
  for (let i = 0; i < sampleCount; i++) {
    // Truncated normals by rejection, always in the order m1, m2, distance, so a seed gives the same draws:
    // masses on (0, ∞), distance on (0, the table's end]. Spending the whole draw budget fails the estimate.
    let m1: number;
    do {
      if (draws++ >= maxDraws) return exhausted();
      m1 = mean1 + sd1 * random.normal();
    } while (!(m1 > 0));
    let m2: number;
    do {
      if (draws++ >= maxDraws) return exhausted();
      m2 = mean2 + sd2 * random.normal();
    } while (!(m2 > 0));
    let z = 0;
    if (table !== null) {
      let d: number;
      do {
        if (draws++ >= maxDraws) return exhausted();
        d = distanceMean + distanceSd * random.normal();
      } while (!(d > 0 && d <= maxDistance));
      z = table.redshift(d);
    }
    const swap = m2 > m1;
    const heavy = (swap ? m2 : m1) / (1 + z);
    const light = (swap ? m1 : m2) / (1 + z);
    const heavyIsNs = heavy < nsMaxMassSolar;
    const lightIsNs = light < nsMaxMassSolar;
    if ((heavy >= nsMaxMassSolar && heavy < gapUpperMassSolar) || (light >= nsMaxMassSolar && light < gapUpperMassSolar)) {
      lowerGap++;
    } else if (heavyIsNs) {
      bns++;
    } else if (lightIsNs) {
      nsbh++;
    } else {
      bbh++;
    }
    if (!lightIsNs) continue;
    neutronStar++;
    // Any neutron-star pair leaves matter; otherwise treat the heavier object as a black hole (FHN 2018 Eq. 4).
    if (heavyIsNs) {
      remnantMatter++;
    } else {
      const eta = (heavy * light) / ((heavy + light) * (heavy + light));
      const compactness = neutronStarCompactness(light, nsRadiusKm);
      if (remnantBracket(eta, compactness, swap ? iscoRadius2 : iscoRadius1) > 0) remnantMatter++;
    }
  }
  return succeed({
    classProbabilities: {
      bns: bns / sampleCount,
      nsbh: nsbh / sampleCount,
      bbh: bbh / sampleCount,
      lowerGap: lowerGap / sampleCount,
    },
    pNeutronStar: neutronStar / sampleCount,
    pRemnantMatter: remnantMatter / sampleCount,
    sampleCount,
  });
}
