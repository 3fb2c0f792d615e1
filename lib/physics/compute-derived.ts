/**
 * computeDerived: everything the feed stores and answers for one trigger revision, assembled from the pieces in
 * this folder. Pure and deterministic (the Monte Carlo is seeded from a string); never throws — each block fails
 * on its own into null plus a reason.
 */
import type { ChirpMassBlock, Derived, ValueWithSd } from "./derived-types";
import { fitTrack } from "./derive-track";
import { planck18DistanceTable, redshiftPerDistance } from "./distance-table";
import { computeMergerFrequencies } from "./merger-frequencies";
import { mergerSpreads } from "./merger-uncertainty";
import { classStandardErrors, computeAstroProbability } from "./p-astro";
import { estimateRemnantMatter } from "./remnant-matter";
import { describeFailure, fail, succeed, type PhysicsResult } from "./result";
import { computeSourceClasses, type GaussianEstimate } from "./source-class";
import { defaultPhysicsSettings, type PhysicsSettings, type TriggerPhysicsInput } from "./index";

/** Path of the first non-finite number inside a value, or null when every number is finite. */
function firstNonFinite(value: unknown, path: string): string | null {
  if (typeof value === "number") return Number.isFinite(value) ? null : path;
  if (value === null || typeof value !== "object") return null;
  for (const [key, inner] of Object.entries(value)) {
    const found = firstNonFinite(inner, `${path}.${key}`);
    if (found !== null) return found;
  }
  return null;
}

/**
 * Runs `body`, turning an unexpected exception into a typed internal-error failure and a result holding NaN or
 * Infinity (extreme but finite inputs, e.g. a 10⁻³⁰⁰ M☉ mass) into a non-finite failure: JSON has neither.
 */
function guarded<T>(body: () => PhysicsResult<T>): PhysicsResult<T> {
  try {
    const result = body();
    if (!result.ok) return result;
    const badPath = firstNonFinite(result.value, "value");
    return badPath === null ? result : fail("non-finite-result", `${badPath} is not finite for these inputs`);
  } catch (error) {
    return fail("internal-error", error instanceof Error ? error.message : String(error));
  }
}

function isGaussian(value: GaussianEstimate | undefined): value is GaussianEstimate {
  return value !== undefined && value !== null && Number.isFinite(value.mean) && Number.isFinite(value.sd) && value.mean > 0 && value.sd >= 0;
}

/** Redshift at the mean distance (Planck 2018), sd by first-order propagation of the distance sd. */
function redshiftFromDistance(distance: GaussianEstimate): PhysicsResult<ValueWithSd> {
  if (!isGaussian(distance)) return fail("invalid-distance", "distance needs a finite mean > 0 and a finite sd ≥ 0");
  const table = planck18DistanceTable();
  const z = table.redshift(distance.mean);
  if (!Number.isFinite(z)) return fail("distance-out-of-range", `mean distance beyond the table (z > ${table.maxRedshift})`);
  return succeed({ value: z, sd: Math.abs(redshiftPerDistance(z, table)) * distance.sd });
}

function sourceFrame(detector: ValueWithSd, redshift: ValueWithSd): ValueWithSd {
  const value = detector.value / (1 + redshift.value);
  const relative = Math.hypot(detector.sd / detector.value, redshift.sd / (1 + redshift.value));
  return { value, sd: value * relative };
}

const errorOf = <T>(result: PhysicsResult<T>): string | null => (result.ok ? null : describeFailure(result));
const valueOf = <T>(result: PhysicsResult<T>): T | null => (result.ok ? result.value : null);

export function computeDerivedPhysics(input: TriggerPhysicsInput, givenSettings: PhysicsSettings, seed: string): Derived {
  const safeInput: Partial<TriggerPhysicsInput> = input !== null && typeof input === "object" ? input : {};
  // Settings stored before a field existed read as its default.
  const settings: PhysicsSettings = { ...defaultPhysicsSettings, ...(givenSettings ?? {}) };
  const track = guarded(() => fitTrack(safeInput, settings, seed));
  const distanceGiven = safeInput.distanceMpc !== undefined && safeInput.distanceMpc !== null;
  const redshift = guarded(() => (distanceGiven ? redshiftFromDistance(safeInput.distanceMpc as GaussianEstimate) : succeed({ value: 0, sd: 0 })));

  const chirpMass = guarded<ChirpMassBlock>(() => {
    if (!track.ok) return track;
    if (track.value.notChirpLike !== null) return fail("track-not-chirp-like", track.value.notChirpLike);
    return succeed({
      detectorFrame: track.value.chirpMass,
      sourceFrame: redshift.ok ? sourceFrame(track.value.chirpMass, redshift.value) : null,
      sourceFrameError: errorOf(redshift),
    });
  });
  const coalescence = guarded<ValueWithSd>(() => {
    if (!track.ok) return track;
    if (track.value.notChirpLike !== null) return fail("track-not-chirp-like", track.value.notChirpLike);
    return succeed(track.value.coalescence);
  });
  const receiptOffsetS = safeInput.secondsSinceEventTimeAtReceipt;
  const secondsToMerger = guarded<number>(() => {
    if (!coalescence.ok) return coalescence;
    if (typeof receiptOffsetS !== "number" || !Number.isFinite(receiptOffsetS)) {
      return fail("missing-input", "secondsSinceEventTimeAtReceipt is not a finite number");
    }
    return succeed(coalescence.value.value - receiptOffsetS);
  });

  const masses = safeInput.masses;
  const spinsGiven = safeInput.spins !== undefined && safeInput.spins !== null;
  const chi1 = spinsGiven ? (safeInput.spins?.chi1 ?? Number.NaN) : 0;
  const chi2 = spinsGiven ? (safeInput.spins?.chi2 ?? Number.NaN) : 0;
  const classes = guarded(() => {
    if (!masses || typeof masses !== "object") return fail("missing-input", "no component masses");
    if (distanceGiven && !redshift.ok) return redshift;
    return computeSourceClasses(
      {
        mass1DetectorFrame: masses.m1,
        mass2DetectorFrame: masses.m2,
        chi1,
        chi2,
        distanceMpc: distanceGiven ? (safeInput.distanceMpc as GaussianEstimate) : null,
      },
      settings,
      seed,
    );
  });
  const mergerInput = () =>
    masses && typeof masses === "object" && isGaussian(masses.m1) && isGaussian(masses.m2)
      ? { mass1DetectorFrame: masses.m1.mean, mass2DetectorFrame: masses.m2.mean, chi1, chi2, spinsAssumed: !spinsGiven, redshift: redshift.ok ? redshift.value.value : null }
      : null;
  const merger = guarded(() => {
    const given = mergerInput();
    if (given === null || !masses) return fail("invalid-mass", "each mass needs a finite mean > 0 and a finite sd ≥ 0");
    const result = computeMergerFrequencies(given);
    if (!result.ok) return result;
    const z = given.redshift ?? 0;
    const bothNs = Math.max(given.mass1DetectorFrame, given.mass2DetectorFrame) / (1 + z) < settings.nsMaxMassSolar;
    return succeed({
      ...result.value,
      sd: mergerSpreads(given, masses.m1.sd, masses.m2.sd),
      remnantNote: bothNs ? "both mean masses are neutron-star masses: the remnant and ringdown apply only if a black hole forms" : null,
    });
  });
  const remnantMatter = guarded(() => {
    const given = mergerInput();
    if (given === null) return fail("invalid-mass", "each mass needs a finite mean > 0 and a finite sd ≥ 0");
    return estimateRemnantMatter({ ...given, redshift: given.redshift ?? 0, nsMaxMassSolar: settings.nsMaxMassSolar, nsRadiusKm: settings.nsRadiusKm });
  });
  const astro = guarded(() =>
    computeAstroProbability(safeInput.networkSnr, safeInput.falseAlarmRatePerYear, classes.ok ? classes.value.classProbabilities : null, settings),
  );

  const classValue = valueOf(classes);
  const classError = errorOf(classes);
  const trackValue = valueOf(track);
  return {
    chirpMass: valueOf(chirpMass),
    chirpMassError: errorOf(chirpMass),
    coalescenceTime: coalescence.ok ? coalescence.value.value : null,
    coalescenceTimeSd: coalescence.ok ? coalescence.value.sd : null,
    coalescenceTimeError: errorOf(coalescence),
    secondsToMerger: valueOf(secondsToMerger),
    secondsToMergerError: errorOf(secondsToMerger),
    classProbabilities: classValue?.classProbabilities ?? null,
    classProbabilitiesError: classError,
    classSampleCount: classValue?.sampleCount ?? 0,
    classProbabilitiesSe: classValue ? classStandardErrors(classValue.classProbabilities, classValue.sampleCount) : null,
    astroProbability: valueOf(astro),
    astroProbabilityError: errorOf(astro),
    remnantMatter: valueOf(remnantMatter),
    remnantMatterError: errorOf(remnantMatter),
    pNeutronStar: classValue?.pNeutronStar ?? null,
    pNeutronStarError: classError,
    pRemnantMatter: classValue?.pRemnantMatter ?? null,
    pRemnantMatterError: classError,
    mergerFrequency: valueOf(merger),
    mergerFrequencyError: errorOf(merger),
    redshift: valueOf(redshift),
    redshiftAssumed: !distanceGiven,
    redshiftError: errorOf(redshift),
    fit: trackValue?.fit ?? null,
    fitError: errorOf(track),
    plot: trackValue?.plot ?? null,
    plotError: errorOf(track),
    settingsUsed: settings,
  };
}
