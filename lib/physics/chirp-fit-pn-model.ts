/**
 * The 3.5PN TaylorT4 model f(t; 𝓜, t_c) for Gauss–Newton (see pn-taylor-t4.ts for the physics and its sources).
 * Parameters are (ln 𝓜, t_c) in the ModelPoint's (logA, tc) slots, 𝓜 in M☉ (detector frame), t_c in s.
 * With M = 𝓜 η^(−3/5) and u = (t_c − t)/M: f = x(u)^(3/2) / (π M), so
 * ∂f/∂ln𝓜 = −f (1 + (3/2) y′) and ∂f/∂t_c = (3/2) f y′ / (t_c − t), y′ = d ln x / d ln u.
 */
import type { Evaluation, Evaluator, ModelPoint, Samples } from "./chirp-fit-model";
import { SUN_MASS_TIME_S } from "./constants";
import { buildPnTable, lookupLnX, type PnTable } from "./pn-taylor-t4";

/** Total mass in seconds for a chirp mass ln 𝓜 (M☉) and the table's η. */
export function totalMassSeconds(table: PnTable, logChirpMass: number): number {
  return Math.exp(logChirpMass) * table.eta ** -0.6 * SUN_MASS_TIME_S;
}

/** f(t) of the model at `point` (Hz), NaN off the model's domain; for plots. */
export function pnFrequencyAt(table: PnTable, point: ModelPoint, tS: number): number {
  const massS = totalMassSeconds(table, point.logA);
  const out = new Float64Array(2);
  const tau = point.tc - tS;
  if (!(tau > 0) || !lookupLnX(table, tau / massS, out)) return Number.NaN;
  return Math.exp(1.5 * (out[0] as number)) / (Math.PI * massS);
}

export function pnEvaluator(samples: Samples, table: PnTable): Evaluator {
  const { t, f, sigma } = samples;
  const out = new Float64Array(2);
  return (point: ModelPoint, inverseNormal): Evaluation | null => {
    const massS = totalMassSeconds(table, point.logA);
    const inverseMass = 1 / massS;
    const scale = 1 / (Math.PI * massS);
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
      if (!(tau > 0) || !lookupLnX(table, tau * inverseMass, out)) return null;
      const yPrime = out[1] as number;
      const model = scale * Math.exp(1.5 * (out[0] as number));
      const r = (f[i] as number) - model;
      const s = sigma === undefined ? 1 : (sigma[i] as number);
      const wi = sigma === undefined ? 1 : 1 / (s * s);
      const ja = -model * (1 + 1.5 * yPrime);
      const jt = (1.5 * model * yPrime) / tau;
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
