/**
 * Numerical core of the f(t) chirp fit (see chirp-fit-time.ts): the model f(t) = fRef (A (t_c − t))^(−3/8) of
 * Peters & Mathews 1963, its χ² and normal equations, a closed-form straight-line start in y = f^(−8/3), and
 * Gauss–Newton iterations with step halving (Press et al., Numerical Recipes, 3rd ed., §15.5).
 */
import { fail, succeed, type PhysicsResult } from "./result";

export interface Evaluation {
  /** whether the sandwich sums (maa, mat, mtt) were accumulated in this pass */
  withSandwich: boolean;
  chiSquare: number;
  residualSumSq: number;
  // Normal matrix (symmetric 2×2) and gradient for the parameters (ln A, t_c).
  naa: number;
  nat: number;
  ntt: number;
  ga: number;
  gt: number;
  // Σ r²/(1 − h)² J Jᵀ, the "meat" of the leverage-corrected sandwich covariance (HC3, MacKinnon & White 1985).
  maa: number;
  mat: number;
  mtt: number;
}

export interface Samples {
  t: readonly number[];
  f: readonly number[];
  sigma: readonly number[] | undefined;
}

export interface ModelPoint {
  logA: number;
  tc: number;
}

/**
 * χ², normal matrix and gradient at (ln A, t_c); null if any sample lies at or after t_c. With `inverseNormal`
 * also the sandwich sums. Local accumulators and one division per sample keep the loop cheap.
 */
export function evaluate(samples: Samples, fRef: number, point: ModelPoint, inverseNormal: readonly [number, number, number] | null = null): Evaluation | null {
  const { t, f, sigma } = samples;
  const scale = fRef * Math.exp(-0.375 * point.logA);
  const tc = point.tc;
  const withLeverage = inverseNormal !== null;
  const iaa = inverseNormal?.[0] ?? 0;
  const iat = inverseNormal?.[1] ?? 0;
  const itt = inverseNormal?.[2] ?? 0;
  let chiSquare = 0;
  let residualSumSq = 0;
  let naa = 0;
  let nat = 0;
  let ntt = 0;
  let ga = 0;
  let gt = 0;
  let maa = 0;
  let mat = 0;
  let mtt = 0;
  const n = t.length;
  for (let i = 0; i < n; i++) {
    const remaining = tc - (t[i] as number);
    if (!(remaining > 0)) return null;
    const inverse = 1 / remaining;
    // remaining^(−3/8) = remaining^(5/8) / remaining, with remaining^(1/8) from three square roots.
    const eighth = Math.sqrt(Math.sqrt(Math.sqrt(remaining)));
    const quarter = eighth * eighth;
    const model = scale * quarter * quarter * eighth * inverse;
    const r = (f[i] as number) - model;
    const s = sigma === undefined ? 1 : (sigma[i] as number);
    const wi = sigma === undefined ? 1 : 1 / (s * s);
    const ja = -0.375 * model;
    const jt = ja * inverse;
    const wr = wi * r;
    chiSquare += wr * r;
    residualSumSq += r * r;
    naa += wi * ja * ja;
    nat += wi * ja * jt;
    ntt += wi * jt * jt;
    ga += wr * ja;
    gt += wr * jt;
    if (withLeverage) {
      const leverage = Math.min(wi * (ja * ja * iaa + 2 * ja * jt * iat + jt * jt * itt), 1 - 1e-12);
      const r2 = (r * r) / ((1 - leverage) * (1 - leverage));
      maa += r2 * ja * ja;
      mat += r2 * ja * jt;
      mtt += r2 * jt * jt;
    }
  }
  return { withSandwich: withLeverage, chiSquare, residualSumSq, naa, nat, ntt, ga, gt, maa, mat, mtt };
}

/** Closed-form weighted straight line in y = (f/fRef)^(−8/3) = A (t_c − t), with σ_y = (8/3) y σ_f / f. */
export function straightLineStart(samples: Samples, fRef: number): PhysicsResult<ModelPoint> {
  const { t, f, sigma } = samples;
  const n = f.length;
  let sumW = 0;
  let sumWt = 0;
  let sumWy = 0;
  let sumWtt = 0;
  let sumWty = 0;
  const t0 = t[0] as number;
  for (let i = 0; i < n; i++) {
    const fi = f[i] as number;
    const g = fi / fRef;
    const cube = Math.cbrt(g);
    const g83 = g * g * cube * cube;
    const y = 1 / g83;
    let wi: number;
    if (sigma === undefined) {
      // One shared σ_f: w ∝ (f/y)² = g^(22/3).
      const g113 = g * g83;
      wi = g113 * g113;
    } else {
      const sigmaY = ((8 / 3) * y * (sigma[i] as number)) / fi;
      wi = 1 / (sigmaY * sigmaY);
    }
    const ti = (t[i] as number) - t0;
    sumW += wi;
    sumWt += wi * ti;
    sumWy += wi * y;
    sumWtt += wi * ti * ti;
    sumWty += wi * ti * y;
  }
  const stt = sumWtt - (sumWt * sumWt) / sumW;
  const slope = (sumWty - (sumWt * sumWy) / sumW) / stt;
  if (!Number.isFinite(slope) || !(stt > 0)) return fail("degenerate-fit", "weighted samples have no spread in time");
  if (!(slope < 0)) return fail("non-physical-slope", "f^(−8/3) does not fall with time (slope ≥ 0)");
  return succeed({ logA: Math.log(-slope), tc: t0 + sumWt / sumW - sumWy / sumW / slope });
}

export interface Refinement {
  point: ModelPoint;
  evaluation: Evaluation;
  iterations: number;
}

const MAX_ITERATIONS = 30;
const MAX_HALVINGS = 40;

/** N⁻¹ of an evaluation's normal matrix as (aa, at, tt), or null when it is singular. */
export function inverseNormalOf(e: Evaluation): readonly [number, number, number] | null {
  const det = e.naa * e.ntt - e.nat * e.nat;
  return det > 0 ? [e.ntt / det, -e.nat / det, e.naa / det] : null;
}

/**
 * Gauss–Newton from `start` until the proposed step is below `stepTolerance` standard errors (the last tiny step
 * is applied without another pass; the evaluation returned is from just before it). With `sandwich`, every pass
 * after the first also accumulates the sandwich sums, with leverages from the previous pass's N⁻¹, so the caller
 * needs no extra pass over the data for them.
 */
/** χ², normal matrix and gradient of one model at a point (with sandwich sums when given N⁻¹); null off-domain. */
export type Evaluator = (point: ModelPoint, inverseNormal: readonly [number, number, number] | null) => Evaluation | null;

/** The leading-order model of this file as an Evaluator. */
export function leadingOrderEvaluator(samples: Samples, fRef: number): Evaluator {
  return (point, inverseNormal) => evaluate(samples, fRef, point, inverseNormal);
}

export function gaussNewton(
  samples: Samples,
  evaluator: Evaluator,
  start: ModelPoint,
  stepTolerance: number,
  sandwich = false,
): PhysicsResult<Refinement> {
  const n = samples.t.length;
  const tLast = samples.t[n - 1] as number;
  const span = tLast - (samples.t[0] as number);
  // The model needs every sample before t_c; nudge a noisy start past the last sample.
  let point: ModelPoint = { logA: start.logA, tc: Math.max(start.tc, tLast + (1e-3 * span) / n) };
  const first = evaluator(point, null);
  if (first === null) return fail("degenerate-fit", "start lies inside the track");
  let current: Evaluation = first;
  let iterations = 0;
  const toleranceSq = stepTolerance * stepTolerance;
  while (iterations < MAX_ITERATIONS) {
    const det = current.naa * current.ntt - current.nat * current.nat;
    if (!(det > 0)) return fail("degenerate-fit", "singular normal matrix");
    const stepA: number = (current.ntt * current.ga - current.nat * current.gt) / det;
    const stepT: number = (current.naa * current.gt - current.nat * current.ga) / det;
    const variance = Math.max(current.chiSquare / Math.max(n - 2, 1), Number.MIN_VALUE);
    const small = (stepA * stepA * det) / (current.ntt * variance) < toleranceSq && (stepT * stepT * det) / (current.naa * variance) < toleranceSq;
    const rounding = Math.abs(stepA) < 1e-14 && Math.abs(stepT) <= 1e-14 * Math.max(1, Math.abs(point.tc));
    if (small || rounding) {
      const last = { logA: point.logA + stepA, tc: point.tc + stepT };
      if (last.tc > tLast) point = last;
      break;
    }
    iterations++;
    let accepted: { point: ModelPoint; e: Evaluation } | null = null;
    for (let h = 0, factor = 1; h < MAX_HALVINGS && accepted === null; h++, factor /= 2) {
      const trial: ModelPoint = { logA: point.logA + factor * stepA, tc: point.tc + factor * stepT };
      const e = evaluator(trial, sandwich ? inverseNormalOf(current) : null);
      if (e !== null && e.chiSquare <= current.chiSquare) accepted = { point: trial, e };
    }
    if (accepted === null) break;
    point = accepted.point;
    current = accepted.e;
  }
  return succeed({ point, evaluation: current, iterations });
}
