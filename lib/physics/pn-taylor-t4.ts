/**
 * Quasi-circular inspiral at 3.5PN order in the TaylorT4 form dx/dt = (64/5) η x⁵ / M · B(x), x = (π M f)^(2/3):
 * Buonanno, Iyer, Ochsner, Pan & Sathyaprakash 2009 (PRD 80, 084043) Eq. 3.6, from the PN energy and flux of
 * Blanchet 2014 (Living Rev. Relativ. 17, 2). Aligned spins enter at their leading orders only: spin–orbit at 1.5PN
 * (4π − β) and spin–spin at 2PN (+σ), Kidder 1995 (PRD 52, 821); higher spin orders and the quadrupole–monopole
 * terms are left out. Coefficients from memory, cross-read against public PN code.
 *
 * The "coalescence time" of this model is the moment x reaches 1/6 (the test-mass ISCO), where PN inspirals are
 * conventionally stopped (common practice). τ = t_c − t in units of M is tabulated once per binary as
 * y = ln x on a uniform grid in ln τ (RK4, Hermite interpolation), so a fit evaluates f(t) with one log and one exp.
 */
const EULER_GAMMA = 0.5772156649015329;
export const ISCO_X = 1 / 6;

export interface PnBinary {
  eta: number;
  /** spin–orbit parameter β of Kidder 1995, aligned spins */
  beta: number;
  /** spin–spin parameter σ of Kidder 1995, aligned spins */
  sigma: number;
}

/** η, β, σ from component masses (any one frame) and aligned spins χ1, χ2 (Kidder 1995 definitions). */
export function pnBinary(mass1: number, mass2: number, chi1: number, chi2: number): PnBinary {
  const total = mass1 + mass2;
  const eta = (mass1 * mass2) / (total * total);
  const q1 = mass1 / total;
  const q2 = mass2 / total;
  const beta = (chi1 * (113 * q1 * q1 + 75 * eta) + chi2 * (113 * q2 * q2 + 75 * eta)) / 12;
  return { eta, beta, sigma: (eta / 48) * (721 - 247) * chi1 * chi2 };
}

/** PN coefficients of B(x) for one binary: B = Σ c_k x^(k/2) + c6log x³ ln(16x). */
export function bracketCoefficients(b: PnBinary): Float64Array {
  const { eta, beta, sigma } = b;
  const pi = Math.PI;
  return Float64Array.from([
    1,
    0,
    -(743 / 336 + (11 / 4) * eta),
    4 * pi - beta,
    34103 / 18144 + (13661 / 2016) * eta + (59 / 18) * eta * eta + sigma,
    -(4159 / 672 + (189 / 8) * eta) * pi,
    16447322263 / 139708800 + (16 / 3) * pi * pi - (1712 / 105) * EULER_GAMMA +
      (-56198689 / 217728 + (451 / 48) * pi * pi) * eta + (541 / 896) * eta * eta - (5605 / 2592) * eta ** 3,
    (-4415 / 4032 + (358675 / 6048) * eta + (91495 / 1512) * eta * eta) * pi,
    -856 / 105,
  ]);
}

/** B(x) of the module comment for coefficients from bracketCoefficients. */
export function taylorT4Bracket(x: number, c: Float64Array): number {
  const v = Math.sqrt(x);
  const x2 = x * x;
  return (
    1 +
    (c[2] as number) * x +
    (c[3] as number) * x * v +
    (c[4] as number) * x2 +
    (c[5] as number) * x2 * v +
    ((c[6] as number) + (c[8] as number) * Math.log(16 * x)) * x2 * x +
    (c[7] as number) * x2 * x * v
  );
}

/** Grid of ln τ/M: from e⁻¹⁴ (a few 10⁻⁶ M before the ISCO) to e²⁸ (beyond any plausible track). */
export const LN_U_MIN = -14;
export const LN_U_MAX = 28;
const STEPS_PER_UNIT = 48;

export interface PnTable {
  eta: number;
  /** y = ln x at node k (ln u = LN_U_MIN + k h) and dy/d ln u there */
  y: Float64Array;
  dy: Float64Array;
  h: number;
  /** dx/du at the ISCO, for the last few 10⁻⁶ M */
  iscoSlope: number;
}

/** Tabulates ln x(ln u); null when B(x) ≤ 0 somewhere below the ISCO (the series has broken down). */
export function buildPnTable(binary: PnBinary): PnTable | null {
  const c = bracketCoefficients(binary);
  const k = (64 / 5) * binary.eta;
  // dy/d ln u = −(64η/5) u x⁴ B(x), with x = e^y.
  const rate = (lnU: number, y: number): number => {
    const x = Math.exp(y);
    const b = taylorT4Bracket(x, c);
    return b > 0 ? -k * Math.exp(lnU + 4 * y) * b : Number.NaN;
  };
  const count = (LN_U_MAX - LN_U_MIN) * STEPS_PER_UNIT + 1;
  const h = 1 / STEPS_PER_UNIT;
  const y = new Float64Array(count);
  const dy = new Float64Array(count);
  const iscoB = taylorT4Bracket(ISCO_X, c);
  if (!(iscoB > 0)) return null;
  const iscoSlope = -k * ISCO_X ** 5 * iscoB;
  y[0] = Math.log(ISCO_X + iscoSlope * Math.exp(LN_U_MIN));
  for (let i = 0; i < count; i++) {
    const lnU = LN_U_MIN + i * h;
    const yi = y[i] as number;
    const k1 = rate(lnU, yi);
    dy[i] = k1;
    if (!Number.isFinite(k1)) return null;
    if (i === count - 1) break;
    const k2 = rate(lnU + h / 2, yi + (h / 2) * k1);
    const k3 = rate(lnU + h / 2, yi + (h / 2) * k2);
    const k4 = rate(lnU + h, yi + h * k3);
    y[i + 1] = yi + (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
  }
  return { eta: binary.eta, y, dy, h, iscoSlope };
}

/**
 * ln x and d ln x / d ln u at u = τ/M > 0, written into out[0], out[1]; false when u lies beyond the table.
 * Cubic Hermite between nodes (values and slopes from the RK4 pass).
 */
export function lookupLnX(table: PnTable, u: number, out: Float64Array): boolean {
  const lnU = Math.log(u);
  const position = (lnU - LN_U_MIN) / table.h;
  if (position < 0) {
    const x = ISCO_X + table.iscoSlope * u;
    out[0] = Math.log(x);
    out[1] = (table.iscoSlope * u) / x;
    return x > 0;
  }
  const i = Math.floor(position);
  if (i >= table.y.length - 1) return false;
  const s = position - i;
  const h = table.h;
  const y0 = table.y[i] as number;
  const y1 = table.y[i + 1] as number;
  const m0 = (table.dy[i] as number) * h;
  const m1 = (table.dy[i + 1] as number) * h;
  const s2 = s * s;
  const s3 = s2 * s;
  out[0] = (2 * s3 - 3 * s2 + 1) * y0 + (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * y1 + (s3 - s2) * m1;
  out[1] = ((6 * s2 - 6 * s) * y0 + (3 * s2 - 4 * s + 1) * m0 + (-6 * s2 + 6 * s) * y1 + (3 * s2 - 2 * s) * m1) / h;
  return true;
}
