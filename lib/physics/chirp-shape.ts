/**
 * Is a fitted f(t) track a chirp at all? Three stated criteria, each with its number and limit in the answer:
 * 1. rising: the least-squares slope of f on t is at least RISE_MIN_Z standard errors above zero, with the noise
 *    σ̂ estimated from each sample's departure from the straight line through its two neighbours (a local,
 *    model-free scatter: curvature only makes σ̂ larger, so this errs towards passing);
 * 2. residual runs (n ≥ 20): the Wald–Wolfowitz runs test on the signs of f − f_model (Wald & Wolfowitz 1940,
 *    Ann. Math. Stat. 11, 147); z below RUNS_MIN_Z means long stretches on one side, a wrong shape;
 * 3. residual scatter (n ≥ 10): mean (f − f_model)² / σ̂² at most SCATTER_MAX, a reduced χ² against the local noise.
 * Limits are ours, set so that noisy chirps (1–5 % noise, 50–10⁵ samples) pass and tails, lines, tones and
 * scattered points fail (tests/physics/chirp-shape.test.ts).
 */
export const RISE_MIN_Z = 5;
export const RUNS_MIN_Z = -4;
export const SCATTER_MAX = 4;

export interface ShapeCriterion {
  name: "rising" | "residual-runs" | "residual-scatter";
  value: number | null;
  limit: number;
  passed: boolean;
}

export interface ShapeCheck {
  passed: boolean;
  criteria: ShapeCriterion[];
  /** one line naming every failed criterion with its value; null when passed */
  failure: string | null;
}

/** σ̂² from departures of each interior sample from the chord through its neighbours, Var = σ² (1 + a² + b²). */
function localNoiseVariance(t: readonly number[], f: readonly number[]): number {
  let sum = 0;
  let count = 0;
  for (let i = 1; i < t.length - 1; i++) {
    const t0 = t[i - 1] as number;
    const t1 = t[i] as number;
    const t2 = t[i + 1] as number;
    const a = (t2 - t1) / (t2 - t0);
    const b = (t1 - t0) / (t2 - t0);
    const d = (f[i] as number) - a * (f[i - 1] as number) - b * (f[i + 1] as number);
    sum += (d * d) / (1 + a * a + b * b);
    count++;
  }
  return count > 0 ? sum / count : Number.NaN;
}

function slopeZ(t: readonly number[], f: readonly number[], noiseSd: number): number {
  const n = t.length;
  let meanT = 0;
  let meanF = 0;
  for (let i = 0; i < n; i++) {
    meanT += (t[i] as number) / n;
    meanF += (f[i] as number) / n;
  }
  let stt = 0;
  let stf = 0;
  for (let i = 0; i < n; i++) {
    const dt = (t[i] as number) - meanT;
    stt += dt * dt;
    stf += dt * ((f[i] as number) - meanF);
  }
  return (stf / stt) * Math.sqrt(stt) / noiseSd;
}

function runsZ(residuals: Float64Array): number | null {
  let positive = 0;
  let negative = 0;
  let runs = 0;
  let previous = 0;
  for (const r of residuals) {
    const sign = r > 0 ? 1 : r < 0 ? -1 : 0;
    if (sign === 0) continue;
    if (sign > 0) positive++;
    else negative++;
    if (sign !== previous) runs++;
    previous = sign;
  }
  const n = positive + negative;
  if (positive === 0 || negative === 0) return n >= 20 ? -Infinity : null;
  const mean = (2 * positive * negative) / n + 1;
  const variance = ((mean - 1) * (mean - 2)) / (n - 1);
  return variance > 0 ? (runs - mean) / Math.sqrt(variance) : null;
}

const fmt = (value: number | null) => (value === null ? "n/a" : Number.isFinite(value) ? value.toFixed(2) : String(value));

/** The three criteria of the module comment for samples (t, f) and the fitted model f_model(t). */
export function checkChirpShape(t: readonly number[], f: readonly number[], modelAt: (tS: number) => number): ShapeCheck {
  const n = t.length;
  const variance = localNoiseVariance(t, f);
  const noiseSd = Math.sqrt(variance);
  const rise = slopeZ(t, f, noiseSd);
  const residuals = new Float64Array(n);
  let sumSq = 0;
  for (let i = 0; i < n; i++) {
    const r = (f[i] as number) - modelAt(t[i] as number);
    residuals[i] = Number.isFinite(r) ? r : 0;
    sumSq += (residuals[i] as number) ** 2;
  }
  const criteria: ShapeCriterion[] = [
    { name: "rising", value: Number.isFinite(rise) ? rise : null, limit: RISE_MIN_Z, passed: rise >= RISE_MIN_Z || rise === Infinity },
  ];
  if (n >= 20) {
    const z = runsZ(residuals);
    criteria.push({ name: "residual-runs", value: z, limit: RUNS_MIN_Z, passed: z === null || z >= RUNS_MIN_Z });
  }
  if (n >= 10) {
    const ratio = variance > 0 ? sumSq / n / variance : sumSq > 0 ? Infinity : 1;
    criteria.push({ name: "residual-scatter", value: ratio, limit: SCATTER_MAX, passed: ratio <= SCATTER_MAX });
  }
  const failed = criteria.filter((c) => !c.passed);
  const describe = (c: ShapeCriterion) =>
    c.name === "rising"
      ? `frequency rise ${fmt(c.value)} σ (need ≥ ${c.limit})`
      : c.name === "residual-runs"
        ? `residual runs z = ${fmt(c.value)} (need ≥ ${c.limit})`
        : `residual scatter ${fmt(c.value)}× the local noise (need ≤ ${c.limit})`;
  return { passed: failed.length === 0, criteria, failure: failed.length === 0 ? null : failed.map(describe).join("; ") };
}
