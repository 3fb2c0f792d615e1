import { SkymapError } from "./errors";
import { MAX_ORDER, nestCentreVec, pixelAreaSr, POW4, uniqOrder } from "./healpix";
import { normalise } from "./validate";
import type { MultiOrderSkymap } from "./types";

/**
 * Builds a multi-order map from UNIQ values and either densities (per sr) or per-pixel probabilities.
 * Checks every UNIQ, that no two pixels overlap, and warns when the pixels do not cover the sky.
 */
export function buildMultiOrder(
  uniq: Float64Array,
  values: Float64Array,
  kind: "density" | "probability",
  warnings: string[],
): { map: MultiOrderSkymap; totalProbability: number; normalised: boolean } {
  const count = uniq.length;
  if (count === 0) throw new SkymapError("bad-uniq", "multi-order map has no pixels");
  const order = new Uint8Array(count);
  const ipix = new Float64Array(count);
  const probability = new Float64Array(count);
  const densityPerSr = new Float64Array(count);
  // every pixel as its index range at MAX_ORDER (exact doubles: 12·4^24 < 2^53), for the overlap check
  const starts = new Float64Array(count);
  const ends = new Float64Array(count);
  let maxOrder = 0;
  let covered = 0;
  for (let i = 0; i < count; i++) {
    const value = uniq[i] ?? -1;
    const o = uniqOrder(value);
    if (o < 0) {
      throw new SkymapError(
        "bad-uniq",
        `UNIQ value ${value} in row ${i + 1} is not a NUNIQ index (4·4^order + ipix, order ≤ 24)`,
      );
    }
    const pix = value - 4 * (POW4[o] ?? 0);
    order[i] = o;
    ipix[i] = pix;
    if (o > maxOrder) maxOrder = o;
    const span = POW4[MAX_ORDER - o] ?? 0;
    starts[i] = pix * span;
    ends[i] = (pix + 1) * span;
    covered += span;
    const area = pixelAreaSr(o);
    const v = values[i] ?? 0;
    probability[i] = kind === "density" ? v * area : v;
    densityPerSr[i] = kind === "density" ? v : v / area;
  }
  checkDisjoint(starts, ends);
  const fraction = covered / (12 * 4 ** MAX_ORDER);
  if (fraction < 1 - 1e-12) warnings.push(`multi-order pixels cover only ${(100 * fraction).toFixed(2)} % of the sky`);
  const { total, normalised } = normalise(probability, warnings, densityPerSr);

  const map: MultiOrderSkymap = { layout: "multiorder", maxOrder, order, ipix, probability, densityPerSr };
  return { map, totalProbability: total, normalised };
}

/**
 * Pixels are index ranges [start, end) at one fine order. Sorting starts and ends separately, the
 * ranges are disjoint iff start(i+1) ≥ end(i) for every i (coverage never reaches 2).
 */
function checkDisjoint(starts: Float64Array, ends: Float64Array): void {
  starts.sort();
  ends.sort();
  for (let i = 0; i + 1 < starts.length; i++) {
    if ((starts[i + 1] ?? 0) < (ends[i] ?? 0)) {
      throw new SkymapError("bad-uniq", "multi-order pixels overlap (a UNIQ repeats or nests inside another)");
    }
  }
}

const centreCache = new WeakMap<MultiOrderSkymap, Float64Array>();

/**
 * Pixel-centre unit vectors, x y z interleaved (length 3 × pixelCount), computed on first use and kept
 * for the map's lifetime, so an upload that only needs the summary does not pay for them.
 */
export function multiOrderCentres(map: MultiOrderSkymap): Float64Array {
  const cached = centreCache.get(map);
  if (cached) return cached;
  const centres = new Float64Array(3 * map.order.length);
  for (let i = 0; i < map.order.length; i++) {
    const [x, y, z] = nestCentreVec(map.order[i] ?? 0, map.ipix[i] ?? 0);
    centres[3 * i] = x;
    centres[3 * i + 1] = y;
    centres[3 * i + 2] = z;
  }
  centreCache.set(map, centres);
  return centres;
}
