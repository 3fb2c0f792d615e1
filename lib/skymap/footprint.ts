import { raDecToVec, vecToRaDec, type V3 } from "./healpix";
import type { SkyPosition } from "./types";

/** An instrument's field of view on the sky: a north-up rectangle or a circle. */
export type Footprint =
  | { shape: "rectangle"; widthDeg: number; heightDeg: number }
  | { shape: "circle"; radiusDeg: number };

/** A footprint placed at a centre, with what the pixel search needs: a bounding cone and an exact test. */
export interface PlacedFootprint {
  centre: V3;
  /** Every direction inside lies within this angle of the centre (radians). */
  boundRadiusRad: number;
  /** True when the unit vector (x, y, z) lies inside (edges included). */
  contains(x: number, y: number, z: number): boolean;
  /**
   * The same test as plain numbers, for loops over many pixels (footprint-search.ts inlines it): a circle is
   * c·p ≥ cosRadius; a rectangle is c·p > 0, |e·p| ≤ tanHalfWidth·(c·p), |n·p| ≤ tanHalfHeight·(c·p).
   */
  test: FootprintTest;
}

export interface FootprintTest {
  circle: boolean;
  cosRadius: number;
  tanHalfWidth: number;
  tanHalfHeight: number;
  east: V3;
  north: V3;
}

const RAD = Math.PI / 180;

/** Local east and north unit vectors at a position (north up; at a pole, east follows the RA given). */
export function localEastNorth(raDeg: number, decDeg: number): { east: V3; north: V3 } {
  const ra = raDeg * RAD;
  const dec = decDeg * RAD;
  return {
    east: [-Math.sin(ra), Math.cos(ra), 0],
    north: [-Math.sin(dec) * Math.cos(ra), -Math.sin(dec) * Math.sin(ra), Math.cos(dec)],
  };
}

/**
 * Places a footprint. A rectangle is the spherical quadrilateral with great-circle edges whose corners are
 * normalize(c + ξe + ηn), ξ = ±tan(w/2), η = ±tan(h/2): the gnomonic de-projection of a tangent-plane
 * rectangle. Great circles are straight lines in the gnomonic projection (Snyder 1987, USGS PP 1395, §22),
 * so p is inside iff p·c > 0, |p·e| ≤ tan(w/2)·(p·c) and |p·n| ≤ tan(h/2)·(p·c). A circle is every
 * direction within radiusDeg of the centre.
 */
export function placeFootprint(footprint: Footprint, raDeg: number, decDeg: number): PlacedFootprint {
  const centre = raDecToVec(raDeg, decDeg);
  const [cx, cy, cz] = centre;
  if (footprint.shape === "circle") {
    const radius = Math.min(Math.PI, footprint.radiusDeg * RAD);
    const cosRadius = Math.cos(radius);
    const test = { circle: true, cosRadius, tanHalfWidth: 0, tanHalfHeight: 0, east: [0, 0, 0] as V3, north: [0, 0, 0] as V3 };
    return { centre, boundRadiusRad: radius, test, contains: (x, y, z) => x * cx + y * cy + z * cz >= cosRadius };
  }
  const { east, north } = localEastNorth(raDeg, decDeg);
  const [ex, ey, ez] = east;
  const [nx, ny, nz] = north;
  const xi = Math.tan((footprint.widthDeg * RAD) / 2);
  const eta = Math.tan((footprint.heightDeg * RAD) / 2);
  return {
    centre,
    boundRadiusRad: Math.atan(Math.hypot(xi, eta)), // the corners are the farthest points
    test: { circle: false, cosRadius: -1, tanHalfWidth: xi, tanHalfHeight: eta, east, north },
    contains(x, y, z) {
      const d = x * cx + y * cy + z * cz;
      if (d <= 0) return false;
      return Math.abs(x * ex + y * ey + z * ez) <= xi * d && Math.abs(x * nx + y * ny + z * nz) <= eta * d;
    },
  };
}

/**
 * Outline for drawing and export: a rectangle's four corners (north-east first, then counter-clockwise as seen
 * from inside the sphere: NE, NW, SW, SE), or a circle's `circleSteps` points.
 */
export function footprintOutline(footprint: Footprint, raDeg: number, decDeg: number, circleSteps = 36): SkyPosition[] {
  const c = raDecToVec(raDeg, decDeg);
  const { east, north } = localEastNorth(raDeg, decDeg);
  const at = (a: number, b: number) => vecToRaDec(normalize([c[0] + a * east[0] + b * north[0], c[1] + a * east[1] + b * north[1], c[2] + a * east[2] + b * north[2]]));
  if (footprint.shape === "rectangle") {
    const xi = Math.tan((footprint.widthDeg * RAD) / 2);
    const eta = Math.tan((footprint.heightDeg * RAD) / 2);
    return [at(xi, eta), at(-xi, eta), at(-xi, -eta), at(xi, -eta)];
  }
  // a circle of angular radius r is the gnomonic circle of radius tan(r) (r < 90°)
  const t = Math.tan(Math.min(footprint.radiusDeg, 89.9) * RAD);
  return Array.from({ length: circleSteps }, (_, k) => {
    const a = (2 * Math.PI * k) / circleSteps;
    return at(t * Math.cos(a), t * Math.sin(a));
  });
}

function normalize(v: V3): V3 {
  const n = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / n, v[1] / n, v[2] / n];
}
