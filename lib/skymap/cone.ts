import { SkymapError } from "./errors";
import { nest2ring, pix2vec_nest, query_disc_inclusive_nest, raDecToVec, type V3 } from "./healpix";
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
  const { centres, probability } = map;
  let sum = 0;
  for (let i = 0; i < probability.length; i++) {
    const dot = (centres[3 * i] ?? 0) * cx + (centres[3 * i + 1] ?? 0) * cy + (centres[3 * i + 2] ?? 0) * cz;
    if (dot >= cosRadius) sum += probability[i] ?? 0;
  }
  return sum;
}

/**
 * Flat maps: candidate pixels from @hscmap/healpix's query_disc (radius ≤ 90°), then the exact centre
 * test. Wider cones are answered as the total minus the complementary cone around the antipode.
 */
function flatCone(map: FlatSkymap, centre: V3, radius: number): number {
  if (radius <= Math.PI / 2) return discSum(map, centre, Math.cos(radius), false);
  const antipode: V3 = [-centre[0], -centre[1], -centre[2]];
  // outside the cone: dot(c, v) < cos r  ⇔  dot(c, −v) > cos(π − r)
  return total(map.probability) - discSum(map, antipode, Math.cos(Math.PI - radius), true);
}

function discSum(map: FlatSkymap, centre: V3, cosRadius: number, strict: boolean): number {
  const { nside, probability } = map;
  const ring = map.layout === "flat-ring";
  let sum = 0;
  query_disc_inclusive_nest(nside, centre, Math.acos(cosRadius), (nest) => {
    const v = pix2vec_nest(nside, nest);
    const dot = v[0] * centre[0] + v[1] * centre[1] + v[2] * centre[2];
    if (strict ? dot > cosRadius : dot >= cosRadius) sum += probability[ring ? nest2ring(nside, nest) : nest] ?? 0;
  });
  return sum;
}
