/**
 * The 3.5PN TaylorT4 model f(t; 𝓜, t_c) for Gauss–Newton (see pn-taylor-t4.ts for the physics and its sources).
 * Parameters are (ln 𝓜, t_c) in the ModelPoint's (logA, tc) slots, 𝓜 in M☉ (detector frame), t_c in s.
 * With M = 𝓜 η^(−3/5), u = (t_c − t)/M and z = x^(3/2) = π M f tabulated against ln u, the Jacobian is closed
 * form: ∂f/∂ln𝓜 = −(z + z′)/(π M) and ∂f/∂t_c = z′/(π M (t_c − t)), z′ = dz/d ln u.
 */
import type { Evaluation, Evaluator, ModelPoint, Samples } from "./chirp-fit-model";
import { SUN_MASS_TIME_S } from "./constants";
import { buildPnTable, ISCO_X, LN_U_MIN, lookupZ, type PnTable } from "./pn-taylor-t4";

/** Total mass in seconds for a chirp mass ln 𝓜 (M☉) and the table's η. */
export function totalMassSeconds(table: PnTable, logChirpMass: number): number {
  return Math.exp(logChirpMass) * table.eta ** -0.6 * SUN_MASS_TIME_S;
}

// One scratch pair for single-point lookups (plots, the shape check): no allocation per call.
const scratch = new Float64Array(2);

/** f(t) of the model at `point` (Hz), NaN off the model's domain; for plots. */
export function pnFrequencyAt(table: PnTable, point: ModelPoint, tS: number): number {
  const massS = totalMassSeconds(table, point.logA);
  const tau = point.tc - tS;
  if (!(tau > 0) || !lookupZ(table, tau / massS, scratch)) return Number.NaN;
  return (scratch[0] as number) / (Math.PI * massS);
}

/** f of the model at every sample time into `out` (Hz; NaN off the domain), one pass without allocation. */
export function pnFrequenciesAt(table: PnTable, point: ModelPoint, t: readonly number[], out: Float64Array): Float64Array {
  for (let i = 0; i < t.length; i++) out[i] = pnFrequencyAt(table, point, t[i] as number);
  return out;
}

export function pnEvaluator(samples: Samples, table: PnTable): Evaluator {
  const { t, f, sigma } = samples;
  const { cubic, intervals, h, iscoSlope } = table;
  const inverseH = 1 / h;
  // 1/σ² once per evaluator, not once per pass (a fit makes two or more passes with each evaluator)
  let weights: Float64Array | null = null;
  if (sigma !== undefined) {
    weights = new Float64Array(sigma.length);
    for (let i = 0; i < sigma.length; i++) weights[i] = 1 / ((sigma[i] as number) * (sigma[i] as number));
  }
  return (point: ModelPoint, inverseNormal): Evaluation | null => {
    const massS = totalMassSeconds(table, point.logA);
    // position = (ln τ − ln M − LN_U_MIN) / h, so one log per sample.
    const offset = -Math.log(massS) - LN_U_MIN;
    const inverseMass = 1 / massS;
    const scale = inverseMass / Math.PI;
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
      const tau = point.tc - (t[i] as number);
      if (!(tau > 0)) return null;
      const position = (Math.log(tau) + offset) * inverseH;
      let z: number;
      let dz: number;
      if (position >= 0) {
        const k = Math.floor(position);
        if (k >= intervals) return null;
        const s = position - k;
        const o = 4 * k;
        const c1 = cubic[o + 1] as number;
        const c2 = cubic[o + 2] as number;
        const c3 = cubic[o + 3] as number;
        z = (cubic[o] as number) + s * (c1 + s * (c2 + s * c3));
        dz = (c1 + s * (2 * c2 + 3 * s * c3)) * inverseH;
      } else {
        // The last few 10⁻⁶ M before the ISCO: x linear in u (pn-taylor-t4.ts).
        const u = tau * inverseMass;
        const x = ISCO_X + iscoSlope * u;
        if (!(x > 0)) return null;
        z = x * Math.sqrt(x);
        dz = (1.5 * z * iscoSlope * u) / x;
      }
      const model = scale * z;
      const r = (f[i] as number) - model;
      const wi = weights === null ? 1 : (weights[i] as number);
      const ja = -scale * (z + dz);
      const jt = (scale * dz) / tau;
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
  };
}

const tableCache = new Map<number, PnTable | null>();

/** 3.5PN TaylorT4 f(t) (Hz) of a non-spinning binary with detector-frame chirp mass 𝓜 (M☉) and η; NaN at or after t_c. */
export function pnChirpFrequencyAt(chirpMassDetectorFrame: number, eta: number, tcS: number, tS: number): number {
  if (!tableCache.has(eta)) tableCache.set(eta, buildPnTable({ eta, beta: 0, sigma: 0 }));
  const table = tableCache.get(eta) ?? null;
  if (table === null) return Number.NaN;
  return pnFrequencyAt(table, { logA: Math.log(chirpMassDetectorFrame), tc: tcS }, tS);
}
