/**
 * Quasi-circular inspiral at 3.5PN order in the TaylorT4 form dx/dt = (64/5) η x⁵ / M · B(x), x = (π M f)^(2/3):
 * Buonanno, Iyer, Ochsner, Pan & Sathyaprakash 2009 (PRD 80, 084043) Eq. 3.6, from the PN energy and flux of
 * Blanchet 2014 (Living Rev. Relativ. 17, 2). Aligned spins enter at their leading orders only: spin–orbit at 1.5PN
 * (4π − β) and spin–spin at 2PN (+σ), Kidder 1995 (PRD 52, 821); higher spin orders and the quadrupole–monopole
 * terms are left out. Coefficients from memory, cross-read against public PN code.
 *
 * The "coalescence time" of this model is the moment x reaches 1/6 (the test-mass ISCO), where PN inspirals are
 * conventionally stopped (common practice). τ = t_c − t in units of M is tabulated once per binary as
 * y = ln x on a uniform grid in ln τ (RK4), stored as cubics in x^(3/2) (Hermite), so a fit evaluates f(t) with one log.
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

const LN_16 = Math.log(16);

/** B(x) of the module comment for coefficients from bracketCoefficients; `lnX` = ln x when the caller has it. */
export function taylorT4Bracket(x: number, c: Float64Array, lnX: number = Math.log(x)): number {
  const v = Math.sqrt(x);
  const x2 = x * x;
  return (
    1 +
    (c[2] as number) * x +
    (c[3] as number) * x * v +
    (c[4] as number) * x2 +
    (c[5] as number) * x2 * v +
    ((c[6] as number) + (c[8] as number) * (LN_16 + lnX)) * x2 * x +
    (c[7] as number) * x2 * x * v
  );
}

/** Grid of ln τ/M: from e⁻¹⁴ (a few 10⁻⁶ M before the ISCO) to e²⁸ (beyond any plausible track). */
export const LN_U_MIN = -14;
export const LN_U_MAX = 28;
const STEPS_PER_UNIT = 48;

export interface PnTable {
  eta: number;
  /**
   * z = x^(3/2) = π M f as a cubic in s ∈ [0, 1) on each interval k (ln u = LN_U_MIN + (k + s) h): four
   * coefficients per interval, c0 + s (c1 + s (c2 + s c3)), from the Hermite form of the RK4 nodes (values and
   * slopes), so a lookup is one log and two Horner sums, with no exp and no allocation.
   */
  cubic: Float64Array;
  intervals: number;
  h: number;
  /** dx/du at the ISCO, for the last few 10⁻⁶ M */
  iscoSlope: number;
}

/** Tabulates z(ln u); null when B(x) ≤ 0 somewhere below the ISCO (the series has broken down). */
export function buildPnTable(binary: PnBinary): PnTable | null {
  const c = bracketCoefficients(binary);
  // read before the RK4 loop: a property read after it made the loop's optimised code (compiled mid-loop, for
  // one object shape) bail out at every call whose binary came from another constructor (spread vs literal)
  const eta = binary.eta;
  const k = (64 / 5) * eta;
  const count = (LN_U_MAX - LN_U_MIN) * STEPS_PER_UNIT + 1;
  const h = 1 / STEPS_PER_UNIT;
  // dy/d ln u = −(64η/5) u x⁴ B(x), with x = e^y; u comes from the node's u times e^(h/2) or e^h (no exp of ln u).
  // y is ln x already, so the bracket's ln(16x) needs no log of its own: one exp per evaluation.
  const rate = (u: number, y: number): number => {
    const x = Math.exp(y);
    const b = taylorT4Bracket(x, c, y);
    const x2 = x * x;
    return b > 0 ? -k * u * x2 * x2 * b : Number.NaN;
  };
  const halfStep = Math.exp(h / 2);
  const iscoB = taylorT4Bracket(ISCO_X, c);
  if (!(iscoB > 0)) return null;
  const iscoSlope = -k * ISCO_X ** 5 * iscoB;
  const cubic = new Float64Array(4 * (count - 1));
  let u = Math.exp(LN_U_MIN);
  let y = Math.log(ISCO_X + iscoSlope * u);
  let k1 = rate(u, y);
  let z0 = Math.exp(1.5 * y);
  let m0 = 1.5 * z0 * k1 * h;
  for (let i = 0; i < count - 1; i++) {
    if (!Number.isFinite(k1)) return null;
    const uMid = u * halfStep;
    const uNext = uMid * halfStep;
    const k2 = rate(uMid, y + (h / 2) * k1);
    const k3 = rate(uMid, y + (h / 2) * k2);
    const k4 = rate(uNext, y + h * k3);
    y += (h / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
    u = uNext;
    k1 = rate(u, y);
    const z1 = Math.exp(1.5 * y);
    const m1 = 1.5 * z1 * k1 * h;
    const o = 4 * i;
    cubic[o] = z0;
    cubic[o + 1] = m0;
    cubic[o + 2] = -3 * z0 - 2 * m0 + 3 * z1 - m1;
    cubic[o + 3] = 2 * z0 + m0 - 2 * z1 + m1;
    z0 = z1;
    m0 = m1;
  }
  if (!Number.isFinite(k1)) return null;
  return { eta, cubic, intervals: count - 1, h, iscoSlope };
}

/**
 * z = x^(3/2) and dz/d ln u at u = τ/M > 0, written into out[0], out[1]; false when u lies beyond the table.
 * (d ln x / d ln u = (2/3) out[1] / out[0].)
 */
export function lookupZ(table: PnTable, u: number, out: Float64Array): boolean {
  const position = (Math.log(u) - LN_U_MIN) / table.h;
  if (position < 0) {
    const x = ISCO_X + table.iscoSlope * u;
    if (!(x > 0)) return false;
    const z = x * Math.sqrt(x);
    out[0] = z;
    out[1] = (1.5 * z * table.iscoSlope * u) / x;
    return true;
  }
  const i = Math.floor(position);
  if (i >= table.intervals) return false;
  const s = position - i;
  const c = table.cubic;
  const o = 4 * i;
  const c1 = c[o + 1] as number;
  const c2 = c[o + 2] as number;
  const c3 = c[o + 3] as number;
  out[0] = (c[o] as number) + s * (c1 + s * (c2 + s * c3));
  out[1] = (c1 + s * (2 * c2 + 3 * s * c3)) / table.h;
  return true;
}
