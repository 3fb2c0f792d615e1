/**
 * Coverage speed (issue 18): 1 000 logged exposures (1 deg² squares and 0.7° circles over a 90 % region of
 * about 1000 deg²) on an nside-512 flat map. Targets: full coverage (union, curve, by site) under 300 ms; adding
 * 100 more exposures to that log under 200 ms. Prints figures only; the machine is shared, so they are noisy.
 *   npx tsx bench/coverage.ts [repeats]
 */
import { computeCoverage, CoverageLog, type CoverageObservation } from "@/lib/coverage";
import { pix2vec_nest, raDecToVec } from "@/lib/skymap/healpix";
import type { FlatSkymap } from "@/lib/skymap/types";

const repeats = Number(process.argv[2] ?? 5);
const ORDER = 9;
// the 90 % region of a 2-D Gaussian is a disc of area 2πσ² ln 10, so σ = √(1000 / 2π ln 10) deg
const SIGMA_DEG = Math.sqrt(1000 / (2 * Math.PI * Math.LN10));
const CENTRE = { raDeg: 140, decDeg: -25 };

function flatMap(): FlatSkymap {
  const nside = 2 ** ORDER;
  const c = raDecToVec(CENTRE.raDeg, CENTRE.decDeg);
  const sigmaRad = (SIGMA_DEG * Math.PI) / 180;
  const probability = new Float64Array(12 * nside * nside);
  let total = 0;
  for (let i = 0; i < probability.length; i++) {
    const [x, y, z] = pix2vec_nest(nside, i);
    const p = Math.exp(-(2 * (1 - Math.min(1, x * c[0] + y * c[1] + z * c[2]))) / (2 * sigmaRad * sigmaRad));
    probability[i] = p;
    total += p;
  }
  for (let i = 0; i < probability.length; i++) probability[i] = (probability[i] ?? 0) / total;
  return { layout: "flat-nested", nside, order: ORDER, probability };
}

/** A fixed pseudo-random log (xorshift32, seeded) so every run times the same work. */
function makeLog(count: number, seed: number, startMinute: number): CoverageObservation[] {
  let s = seed >>> 0;
  const next = () => {
    s ^= s << 13;
    s ^= s >>> 17;
    s ^= s << 5;
    return (s >>> 0) / 2 ** 32;
  };
  const sites = ["site-a", "site-b", "site-c", "site-d"];
  return Array.from({ length: count }, (_, k) => ({
    siteId: sites[k % sites.length] ?? null,
    footprint: next() < 0.7 ? { shape: "rectangle", widthDeg: 1, heightDeg: 1 } : { shape: "circle", radiusDeg: 0.7 },
    raDeg: CENTRE.raDeg + (next() - 0.5) * 4 * SIGMA_DEG,
    decDeg: CENTRE.decDeg + (next() - 0.5) * 4 * SIGMA_DEG,
    startTime: new Date(Date.UTC(2026, 11, 1) + (startMinute + k) * 60_000),
    exposureS: 60,
  }));
}

function ms(f: () => void): number {
  const t0 = performance.now();
  f();
  return performance.now() - t0;
}

const map = flatMap();
const merger = new Date(Date.UTC(2026, 11, 1));
const first = makeLog(1000, 18, 0);
const more = makeLog(100, 1818, 1000);
const full: number[] = [];
const extra: number[] = [];
let covered = 0;
for (let r = 0; r < repeats; r++) {
  full.push(ms(() => (covered = computeCoverage(map, first, merger).coveredProbability)));
  const log = new CoverageLog(map, merger).add(first);
  extra.push(ms(() => log.add(more).result()));
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? 0;
console.log(`nside 512, ${first.length} exposures, 4 sites: covered probability ${covered.toFixed(4)}`);
console.log(`full coverage: median ${median(full).toFixed(1)} ms, max ${Math.max(...full).toFixed(1)} ms (target < 300 ms)`);
console.log(`adding ${more.length} more: median ${median(extra).toFixed(1)} ms, max ${Math.max(...extra).toFixed(1)} ms (target < 200 ms)`);
