/** d3-geo-projection 4 ships no types; only what Chirpdesk uses is declared (projections behave as d3-geo's). */
declare module "d3-geo-projection" {
  import type { GeoProjection } from "d3-geo";

  /** Mollweide's equal-area pseudocylindrical projection. */
  export function geoMollweide(): GeoProjection;
}
