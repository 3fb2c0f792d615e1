/**
 * The chirp fit block of computeDerived: plausibility (track-plausibility.ts), the fit with the configured model
 * (3.5PN TaylorT4 when the trigger's masses are usable, else leading order, said in `fit.model` and a warning),
 * and the chirp-shape check (chirp-shape.ts). A track that fails plausibility or shape gets no chirp mass.
 */
import { fitPnTrack, type PnBinaryInput } from "./chirp-fit-pn";
import { fitTimeTrack, type TimeTrackFit, type TimeTrackInput } from "./chirp-fit-time";
import { checkChirpShape, type ShapeCheck } from "./chirp-shape";
import type { FitDiagnostics, FitPlot, ValueWithSd } from "./derived-types";
import { timeTrackPlot } from "./fit-plot";
import { fail, succeed, type PhysicsResult } from "./result";
import { checkTrackPlausibility } from "./track-plausibility";
import { validateTimeTrack } from "./time-track-validation";
import type { PhysicsSettings, TriggerPhysicsInput } from "./index";

export type TrackFitOutcome = {
  fit: FitDiagnostics;
  plot: FitPlot;
  chirpMass: ValueWithSd;
  coalescence: ValueWithSd;
  /** set when the shape check failed: the chirp mass and t_c must not be shown */
  notChirpLike: string | null;
};

function frequencyRange(f: readonly number[]): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  for (const value of f) {
    min = Math.min(min, value);
    max = Math.max(max, value);
  }
  return { min, max };
}

/** A χ²/dof well above 1 means the quoted per-sample uncertainties were too small; say so beside the numbers. */
function fitWarnings(reducedChiSquare: number | null): string[] {
  return reducedChiSquare !== null && reducedChiSquare > 3
    ? [`residuals exceed the quoted uncertainties (χ²/dof = ${reducedChiSquare.toFixed(2)}); errors scaled up`]
    : [];
}

function usableMasses(input: Partial<TriggerPhysicsInput>): PnBinaryInput | null {
  const m = input.masses;
  const ok = (g: { mean: number; sd: number } | undefined) =>
    g !== undefined && g !== null && Number.isFinite(g.mean) && g.mean > 0 && Number.isFinite(g.sd) && g.sd >= 0;
  if (!m || typeof m !== "object" || !ok(m.m1) || !ok(m.m2)) return null;
  const chi1 = input.spins?.chi1 ?? 0;
  const chi2 = input.spins?.chi2 ?? 0;
  if (!(Math.abs(chi1) <= 1) || !(Math.abs(chi2) <= 1)) return null;
  return { mass1: m.m1, mass2: m.m2, chi1, chi2 };
}

interface TimeFitChoice {
  fit: TimeTrackFit;
  model: "pn-3.5" | "leading-order";
  frequencyAt: (tS: number) => number;
  massRatio: FitDiagnostics["massRatio"];
  warnings: string[];
}

function fitTimeTrackWithModel(track: TimeTrackInput, input: Partial<TriggerPhysicsInput>, settings: PhysicsSettings, seed: string): PhysicsResult<TimeFitChoice> {
  const binary = usableMasses(input);
  if (settings.chirpModel !== "leading-order" && binary !== null) {
    const pn = fitPnTrack(track, binary, seed);
    if (!pn.ok) return pn;
    const { eta, etaSd, chirpMassSdFromMassRatio } = pn.value;
    return succeed({ fit: pn.value, model: "pn-3.5", frequencyAt: pn.value.frequencyAt, massRatio: { eta, etaSd, chirpMassSdFromMassRatio }, warnings: [] });
  }
  const lo = fitTimeTrack(track);
  if (!lo.ok) return lo;
  const { referenceFrequencyHz, amplitudePerS } = lo.value.model;
  const tc = lo.value.coalescenceTimeS;
  const warnings = settings.chirpModel === "leading-order"
    ? ["leading-order chirp (physics setting): biased by several per cent for black-hole pairs"]
    : ["no usable component masses for the mass ratio: leading-order chirp, biased by several per cent for black-hole pairs"];
  return succeed({
    fit: lo.value,
    model: "leading-order",
    frequencyAt: (tS: number) => (tc - tS > 0 ? referenceFrequencyHz * (amplitudePerS * (tc - tS)) ** (-3 / 8) : Number.NaN),
    massRatio: null,
    warnings,
  });
}

function timeOutcome(track: TimeTrackInput, input: Partial<TriggerPhysicsInput>, settings: PhysicsSettings, seed: string): PhysicsResult<TrackFitOutcome> {
  const checked = validateTimeTrack(track);
  if (!checked.ok) return checked;
  const plausible = checkTrackPlausibility(track.t, track.f);
  if (!plausible.ok) return plausible;
  const chosen = fitTimeTrackWithModel(track, input, settings, seed);
  if (!chosen.ok) return chosen;
  const { fit, frequencyAt } = chosen.value;
  const shape: ShapeCheck = checkChirpShape(track.t, track.f, frequencyAt);
  const range = frequencyRange(track.f);
  const residualRms = Number.isFinite(fit.residualRmsHz) ? fit.residualRmsHz : null;
  return succeed({
    fit: {
      trackKind: "time",
      model: chosen.value.model,
      residualRms,
      residualRmsUnit: "Hz",
      samplesUsed: fit.samplesUsed,
      reducedChiSquare: fit.reducedChiSquare,
      uncertaintyScale: fit.uncertaintyScale,
      weighting: fit.weighting,
      frequencyMinHz: range.min,
      frequencyMaxHz: range.max,
      massRatio: chosen.value.massRatio,
      shapeCheck: shape,
      warnings: [...chosen.value.warnings, ...fitWarnings(fit.reducedChiSquare), ...(shape.passed ? [] : [`not chirp-like: ${shape.failure}`])],
    },
    plot: timeTrackPlot(fit.coalescenceTimeS, track.t, track.f, frequencyAt),
    chirpMass: { value: fit.chirpMassDetectorFrame, sd: fit.chirpMassDetectorFrameSd },
    coalescence: { value: fit.coalescenceTimeS, sd: fit.coalescenceTimeSd },
    notChirpLike: shape.passed ? null : shape.failure,
  });
}

/** The feed sends f(t) samples only (lib/validations/feed.ts); anything else fails validation as "missing-input". */
export function fitTrack(input: Partial<TriggerPhysicsInput>, settings: PhysicsSettings, seed: string): PhysicsResult<TrackFitOutcome> {
  const track = input.frequencyTrack;
  if (track === undefined || track === null || typeof track !== "object") return fail("missing-input", "no frequency track");
  return timeOutcome(track, input, settings, seed);
}
