import type { V3 } from "./healpix";

/**
 * Pixels whose centre c satisfies c·centre ≥ cosRadius (a disc). Works ring by ring on the RING-scheme geometry
 * of Górski et al. (2005, ApJ 622, 759, §4: ring heights z and pixel longitudes φ), so whole runs of pixels are
 * taken without computing their centres; only the two pixels at each end of a run are tested exactly.
 * Any radius works, up to the whole sphere. (@hscmap/healpix's query_disc computes every candidate's
 * centre and stops at 90°, which was too slow for wide cones on nside-512 maps.)
 * Each pixel comes with its centre's z and φ (radians), which the ring walk has at hand, so a caller
 * testing a tighter shape inside the disc need not recompute the centre.
 */
export type DiscVisitor = (ringPix: number, z: number, phiRad: number) => void;

/**
 * A reusable, growing buffer of disc pixels (RING index, centre z, centre φ), so hot loops (one footprint per
 * candidate centre) neither allocate per pixel nor pay a callback per pixel.
 */
export class DiscPixels {
  length = 0;
  ringPix = new Float64Array(1024);
  z = new Float64Array(1024);
  phi = new Float64Array(1024);

  clear(): void {
    this.length = 0;
  }

  push(ringPix: number, z: number, phi: number): void {
    if (this.length === this.ringPix.length) this.grow();
    const n = this.length++;
    this.ringPix[n] = ringPix;
    this.z[n] = z;
    this.phi[n] = phi;
  }

  private grow(): void {
    const size = 2 * this.ringPix.length;
    for (const key of ["ringPix", "z", "phi"] as const) {
      const next = new Float64Array(size);
      next.set(this[key]);
      this[key] = next;
    }
  }
}

export function forEachPixelInDisc(nside: number, centre: V3, cosRadius: number, visit: DiscVisitor): void {
  const out = new DiscPixels();
  collectPixelsInDisc(nside, centre, cosRadius, out);
  const { ringPix, z, phi } = out;
  for (let k = 0; k < out.length; k++) visit(ringPix[k] ?? 0, z[k] ?? 0, phi[k] ?? 0);
}

/** The disc's pixels appended to `out` (cleared first), ring by ring, in the order forEachPixelInDisc visits them. */
export function collectPixelsInDisc(nside: number, centre: V3, cosRadius: number, out: DiscPixels): void {
  out.clear();
  const [cx, cy, z0] = centre;
  const s0 = Math.hypot(cx, cy);
  const phi0 = Math.atan2(cy, cx);
  const npix = 12 * nside * nside;
  const ncap = 2 * nside * (nside - 1);

  // only the rings between the disc's highest and lowest z can hold centres inside (one ring of margin each side)
  const radius = Math.acos(Math.max(-1, Math.min(1, cosRadius)));
  const theta0 = Math.acos(Math.max(-1, Math.min(1, z0)));
  const firstRing = Math.max(1, Math.floor(ringOfZ(nside, Math.cos(Math.max(0, theta0 - radius)))) - 1);
  const lastRing = Math.min(4 * nside - 1, Math.ceil(ringOfZ(nside, Math.cos(Math.min(Math.PI, theta0 + radius)))) + 1);

  for (let ring = firstRing; ring <= lastRing; ring++) {
    let z: number, count: number, start: number, phase: number;
    if (ring < nside) {
      z = 1 - (ring * ring) / (3 * nside * nside);
      count = 4 * ring;
      start = 2 * ring * (ring - 1);
      phase = 0.5;
    } else if (ring <= 3 * nside) {
      z = (4 / 3) - (2 * ring) / (3 * nside);
      count = 4 * nside;
      start = ncap + (ring - nside) * 4 * nside;
      phase = (ring + nside) % 2 === 1 ? 0 : 0.5;
    } else {
      const fromSouth = 4 * nside - ring;
      z = -(1 - (fromSouth * fromSouth) / (3 * nside * nside));
      count = 4 * fromSouth;
      start = npix - 2 * fromSouth * (fromSouth + 1);
      phase = 0.5;
    }
    const s = Math.sqrt((1 - z) * (1 + z));
    const step = (2 * Math.PI) / count; // pixel j (0-based) sits at φ = (j + phase) · step
    const zz = z0 * z;
    const ss = s0 * s;

    if (ss === 0) {
      if (zz >= cosRadius) for (let j = 0; j < count; j++) out.push(start + j, z, (j + phase) * step);
      continue;
    }
    const x = (cosRadius - zz) / ss;
    if (x > 1) continue;
    if (x <= -1) {
      for (let j = 0; j < count; j++) out.push(start + j, z, (j + phase) * step);
      continue;
    }
    const halfWidth = Math.acos(x);
    const lo = Math.ceil((phi0 - halfWidth) / step - phase);
    const hi = Math.floor((phi0 + halfWidth) / step - phase);
    if (hi - lo + 3 >= count) {
      for (let j = 0; j < count; j++) if (zz + ss * Math.cos((j + phase) * step - phi0) >= cosRadius) out.push(start + j, z, (j + phase) * step);
      continue;
    }
    // pixels strictly between lo and hi are inside by a margin of a whole step; test the ends exactly
    for (let j = lo - 1; j <= hi + 1; j++) {
      if ((j > lo && j < hi) || zz + ss * Math.cos((j + phase) * step - phi0) >= cosRadius) {
        out.push(start + (((j % count) + count) % count), z, (j + phase) * step);
      }
    }
  }
}

/** Ring number (1 … 4·nside − 1, fractional) of height z: the inverse of the ring heights above. */
function ringOfZ(nside: number, z: number): number {
  if (z > 2 / 3) return nside * Math.sqrt(3 * (1 - z));
  if (z >= -2 / 3) return nside * (2 - 1.5 * z);
  return 4 * nside - nside * Math.sqrt(3 * (1 + z));
}
