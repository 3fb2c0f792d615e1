import { geoAzimuthalEqualArea, geoDistance, type GeoProjection } from "d3-geo";
import { geoMollweide } from "d3-geo-projection";

export type SkyView = { kind: "all-sky" } | { kind: "zoom"; centre: { raDeg: number; decDeg: number }; radiusDeg: number };

export interface ProjectedView {
  projection: GeoProjection;
  /** [raDeg, decDeg] under a point of the drawing, or null outside the drawn sky. */
  skyAt: (x: number, y: number) => [number, number] | null;
  /** The drawing position of a sky position, or null when it is outside the view. */
  place: (raDeg: number, decDeg: number) => [number, number] | null;
}

const PAD = 6;

/**
 * The sky as astronomers draw it from inside the sphere: east (increasing RA) to the left (common practice), so the
 * projections are mirrored. All-sky: Mollweide centred on RA 12 h. Zoom: Lambert azimuthal equal-area on the region.
 */
export function projectView(view: SkyView, width: number, height: number): ProjectedView {
  const extent: [[number, number], [number, number]] = [
    [PAD, PAD],
    [width - PAD, height - PAD],
  ];
  if (view.kind === "all-sky") {
    const projection = geoMollweide().reflectX(true).rotate([-180, 0]).fitExtent(extent, { type: "Sphere" });
    // Mollweide's outline is an ellipse with semi-axes 2√2·k and √2·k (k = scale)
    const [cx, cy] = projection.translate();
    const a = 2 * Math.SQRT2 * projection.scale();
    const b = Math.SQRT2 * projection.scale();
    const inside = (x: number, y: number) => ((x - cx) / a) ** 2 + ((y - cy) / b) ** 2 <= 1;
    return {
      projection,
      skyAt: (x, y) => (inside(x, y) ? (projection.invert?.([x, y]) ?? null) : null),
      place: (ra, dec) => projection([ra, dec]),
    };
  }
  const { centre, radiusDeg } = view;
  const centreLonLat: [number, number] = [centre.raDeg, centre.decDeg];
  const radiusRad = (radiusDeg * Math.PI) / 180;
  const projection = geoAzimuthalEqualArea()
    .reflectX(true)
    .rotate([-centre.raDeg, -centre.decDeg])
    .clipAngle(radiusDeg)
    .fitExtent(extent, { type: "Sphere" });
  const within = (p: [number, number]) => geoDistance(p, centreLonLat) <= radiusRad;
  return {
    projection,
    skyAt: (x, y) => {
      const p = projection.invert?.([x, y]);
      return p && Number.isFinite(p[0]) && within(p) ? p : null;
    },
    place: (ra, dec) => (within([ra, dec]) ? projection([ra, dec]) : null),
  };
}

/**
 * A zoom that holds the whole credible region: centred on the probability-weighted mean direction of its samples
 * (the peak when they cancel out), out to the farthest sample plus a margin.
 */
export function zoomOn(peak: { raDeg: number; decDeg: number }, region: ReadonlyArray<{ raDeg: number; decDeg: number; prob: number }>): SkyView {
  const rad = Math.PI / 180;
  let [x, y, z] = [0, 0, 0];
  for (const p of region) {
    x += p.prob * Math.cos(p.decDeg * rad) * Math.cos(p.raDeg * rad);
    y += p.prob * Math.cos(p.decDeg * rad) * Math.sin(p.raDeg * rad);
    z += p.prob * Math.sin(p.decDeg * rad);
  }
  const norm = Math.hypot(x, y, z);
  const centre =
    norm > 0.3 ? { raDeg: ((Math.atan2(y, x) / rad) + 360) % 360, decDeg: Math.asin(z / norm) / rad } : peak;
  let farthest = 0;
  for (const p of region) farthest = Math.max(farthest, geoDistance([centre.raDeg, centre.decDeg], [p.raDeg, p.decDeg]));
  const radiusDeg = Math.min(90, Math.max(6, (farthest / rad) * 1.1 + 2));
  return { kind: "zoom", centre, radiusDeg };
}
