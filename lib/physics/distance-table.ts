/**
 * Tabulated luminosity distance D_L(z) = (1+z) (c/H0) ∫₀^z dz'/E(z') (Hogg 1999, astro-ph/9905116, Eqs. 15–16,
 * 21) on a uniform grid in u = ln(1+z), integrated with Simpson's rule per cell and read back with cubic Hermite
 * interpolation; the inverse z(D_L) uses the same nodes (D_L is monotone in z) with exact node derivatives.
 */
import { createHubbleRate, hubbleDistanceMpc, planck18, type FlatLambdaCdmParameters } from "./cosmology";

export const DISTANCE_TABLE_MAX_REDSHIFT = 100;
const CELL_COUNT = 4096;
const HINT_WIDTH_MPC = 10;
const HINT_BUCKETS = 10_000;

export interface DistanceTable {
  maxRedshift: number;
  maxLuminosityDistanceMpc: number;
  luminosityDistanceMpc(z: number): number;
  redshift(luminosityDistanceMpc: number): number;
}

function hermite(s: number, p0: number, m0: number, p1: number, m1: number, h: number): number {
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * p0 + (s3 - 2 * s2 + s) * h * m0 + (-2 * s3 + 3 * s2) * p1 + (s3 - s2) * h * m1;
}

/** Table of D_L(z) (Mpc) for 0 ≤ z ≤ maxRedshift and its inverse, Hogg 1999 Eqs. 15–16 and 21 (see module comment). */
export function createDistanceTable(
  params: FlatLambdaCdmParameters,
  maxRedshift: number = DISTANCE_TABLE_MAX_REDSHIFT,
): DistanceTable {
  const hubbleRate = createHubbleRate(params);
  const hubbleMpc = hubbleDistanceMpc(params);
  const uMax = Math.log1p(maxRedshift);
  const h = uMax / CELL_COUNT;
  const nodes = CELL_COUNT + 1;
  // Comoving distance in units of c/H0 and its u-derivative (1+z)/E(z) at each node.
  const comoving = new Float64Array(nodes);
  const comovingSlope = new Float64Array(nodes);
  const integrand = (u: number) => Math.exp(u) / hubbleRate(Math.expm1(u));
  comovingSlope[0] = integrand(0);
  for (let k = 1; k < nodes; k++) {
    comovingSlope[k] = integrand(k * h);
    const mid = integrand((k - 0.5) * h);
    comoving[k] = (comoving[k - 1] as number) + (h / 6) * ((comovingSlope[k - 1] as number) + 4 * mid + (comovingSlope[k] as number));
  }
  // D_L(u) = e^u D_C(u) (Mpc) and dD_L/du = e^u (D_C + dD_C/du).
  const luminosity = new Float64Array(nodes);
  const luminositySlope = new Float64Array(nodes);
  for (let k = 0; k < nodes; k++) {
    const e = Math.exp(k * h);
    luminosity[k] = e * (comoving[k] as number) * hubbleMpc;
    luminositySlope[k] = e * ((comoving[k] as number) + (comovingSlope[k] as number)) * hubbleMpc;
  }
  const maxLuminosityDistanceMpc = luminosity[CELL_COUNT] as number;
  // Search hints: for each 10 Mpc bucket below 10⁵ Mpc, the last node at or below the bucket's start, so the
  // inverse (called once per Monte Carlo sample) bisects a cell or two instead of all 4096. Same answer, fewer steps.
  const hintCount = Math.min(HINT_BUCKETS, Math.ceil(maxLuminosityDistanceMpc / HINT_WIDTH_MPC));
  const hints = new Int32Array(hintCount + 1);
  for (let b = 0, k = 0; b <= hintCount; b++) {
    while (k < CELL_COUNT && (luminosity[k + 1] as number) <= b * HINT_WIDTH_MPC) k++;
    hints[b] = k;
  }

  function luminosityDistanceMpc(z: number): number {
    if (!(z >= 0) || z > maxRedshift) return Number.NaN;
    const u = Math.log1p(z);
    const k = Math.min(Math.floor(u / h), CELL_COUNT - 1);
    const s = (u - k * h) / h;
    const dc = hermite(s, comoving[k] as number, comovingSlope[k] as number, comoving[k + 1] as number, comovingSlope[k + 1] as number, h);
    return (1 + z) * dc * hubbleMpc;
  }

  function redshift(distanceMpc: number): number {
    if (!(distanceMpc >= 0) || distanceMpc > maxLuminosityDistanceMpc) return Number.NaN;
    const bucket = Math.floor(distanceMpc / HINT_WIDTH_MPC);
    let lo = bucket < hintCount ? (hints[bucket] as number) : 0;
    let hi = bucket < hintCount ? Math.min(CELL_COUNT, (hints[bucket + 1] as number) + 1) : CELL_COUNT;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if ((luminosity[mid] as number) <= distanceMpc) lo = mid;
      else hi = mid;
    }
    const d0 = luminosity[lo] as number;
    const d1 = luminosity[hi] as number;
    const width = d1 - d0;
    // Inverse Hermite: u(D) with du/dD = 1/(dD/du) at the two nodes.
    const u = hermite((distanceMpc - d0) / width, lo * h, 1 / (luminositySlope[lo] as number), hi * h, 1 / (luminositySlope[hi] as number), width);
    return Math.expm1(u);
  }

  return { maxRedshift, maxLuminosityDistanceMpc, luminosityDistanceMpc, redshift };
}

let planck18Table: DistanceTable | undefined;

/** The Planck 2018 table, built once on first use (a few milliseconds) and shared. */
export function planck18DistanceTable(): DistanceTable {
  planck18Table ??= createDistanceTable(planck18);
  return planck18Table;
}

/** Luminosity distance (Mpc) at redshift z in Planck 2018 flat ΛCDM (Hogg 1999 Eq. 21); NaN outside 0 ≤ z ≤ 100. */
export function luminosityDistanceFromRedshift(z: number): number {
  return planck18DistanceTable().luminosityDistanceMpc(z);
}

/** Redshift at luminosity distance dMpc in Planck 2018 flat ΛCDM (monotone inverse of Hogg 1999 Eq. 21); NaN outside. */
export function redshiftFromLuminosityDistance(dMpc: number): number {
  return planck18DistanceTable().redshift(dMpc);
}

/** dz/dD_L (1/Mpc) at redshift z, for propagating a distance uncertainty to first order. */
export function redshiftPerDistance(z: number, table: DistanceTable = planck18DistanceTable()): number {
  const step = 1e-6 * Math.max(z, 1e-3);
  const lower = Math.max(0, z - step);
  const upper = Math.min(table.maxRedshift, z + step);
  return (upper - lower) / (table.luminosityDistanceMpc(upper) - table.luminosityDistanceMpc(lower));
}
