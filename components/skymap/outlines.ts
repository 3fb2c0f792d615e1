import { geoArea } from "d3-geo";
import type { Polygon } from "geojson";

/** A footprint drawn on the sky views: observed ones filled and solid, planned ones dashed and open. */
export interface SkyOutline {
  id: string;
  /** corners (or circle points) in order, [raDeg, decDeg], not closed */
  ring: ReadonlyArray<readonly [number, number]>;
  style: "observed" | "planned";
  label: string;
}

/**
 * The footprint as a GeoJSON polygon d3 fills on the inside: d3's spherical polygons are the region to the right of
 * their ring, so a ring whose polygon would cover more than a hemisphere is reversed.
 */
export function outlinePolygon(outline: Pick<SkyOutline, "ring">): Polygon {
  const ring = outline.ring.map(([ra, dec]) => [ra, dec]);
  const closed = [...ring, ring[0] ?? [0, 0]];
  const polygon: Polygon = { type: "Polygon", coordinates: [closed] };
  if (geoArea(polygon) > 2 * Math.PI) polygon.coordinates = [[...closed].reverse()];
  return polygon;
}
