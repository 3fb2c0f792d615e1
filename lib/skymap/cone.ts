import { SkymapError } from "./errors";
import { forEachPixelInDisc } from "./disc";
import { raDecToVec, ringToNest, type V3 } from "./healpix";
import { multiOrderCentres } from "./multiorder";
import type { FlatSkymap, MultiOrderSkymap, SkymapMap } from "./types";

/**
 * Probability enclosed in a cone, counting each pixel whose centre lies within the radius (no partial
 * pixels: exact per pixel-centre inclusion, as healpy's query_disc with inclusive=False). The error is
 * therefore of the order of the probability in one ring of boundary pixels.
 */
export function coneProbability(map: SkymapMap, raDeg: number, decDeg: number, radiusDeg: number): number {
  if (![raDeg, decDeg, radiusDeg].every(Number.isFinite) || Math.abs(decDeg) > 90 || radiusDeg < 0) {
    throw new SkymapError(
      "bad-query",
      `cone needs finite raDeg, decDeg in [-90, 90] and radiusDeg ≥ 0; got ${raDeg}, ${decDeg}, ${radiusDeg}`,
    );
  }
  const centre = raDecToVec(raDeg, decDeg);
  if (radiusDeg >= 180) return total(map.probability);
  const radius = (radiusDeg * Math.PI) / 180;
  return map.layout === "multiorder" ? multiOrderCone(map, centre, radius) : flatCone(map, centre, radius);
}

function total(values: Float64Array): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i] ?? 0;
  return sum;
}

function multiOrderCone(map: MultiOrderSkymap, centre: V3, radius: number): number {
  const cosRadius = Math.cos(radius);
  const [cx, cy, cz] = centre;
  const centres = multiOrderCentres(map);
  const { probability } = map;
  let sum = 0;
  for (let i = 0; i < probability.length; i++) {
    const dot = (centres[3 * i] ?? 0) * cx + (centres[3 * i + 1] ?? 0) * cy + (centres[3 * i + 2] ?? 0) * cz;
    if (dot >= cosRadius) sum += probability[i] ?? 0;
  }
  return sum;
}

/** Flat maps: whole runs of each HEALPix ring inside the cone (see disc.ts). */
function flatCone(map: FlatSkymap, centre: V3, radius: number): number {
  const { nside, probability } = map;
  const ring = map.layout === "flat-ring";
  let sum = 0;
  forEachPixelInDisc(nside, centre, Math.cos(radius), (ringPix) => {
    sum += probability[ring ? ringPix : ringToNest(nside, ringPix)] ?? 0;
  });
  return sum;
}
