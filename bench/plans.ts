/**
 * Planner speed (issue 17): greedy plans for four instruments (0.5, 3, 10 and 50 deg² square footprints) on a
 * sky map whose 90 % region is 1000 deg², from an nside-512 flat map and from an equivalent multi-order map
 * (order 9 where the probability is, order 4 elsewhere). Targets: each plan under 300 ms, all four under 1 s.
 * Prints figures only; the machine is shared, so wall times are noisy: each plan's CPU time (process.cpuUsage,
 * user + system) is printed beside it, and the medians over the repeats at the end.   npx tsx bench/plans.ts [repeats]
 */
import os from "node:os";
import { greedyPlan } from "@/lib/planning/greedy";
import type { Footprint } from "@/lib/skymap/footprint";
import { POW4, pix2vec_nest, pixelAreaSr, raDecToVec, SR_TO_DEG2 } from "@/lib/skymap/healpix";
import { credibleArea } from "@/lib/skymap/credible";
import type { FlatSkymap, MultiOrderSkymap, SkymapMap } from "@/lib/skymap/types";

const repeats = Number(process.argv[2] ?? 3);
// a Gaussian blob: the 90 % region of a 2-D Gaussian is a disc of area 2πσ² ln 10, so σ = √(1000 / 2π ln 10) deg
const SIGMA_RAD = (Math.sqrt(1000 / (2 * Math.PI * Math.LN10)) * Math.PI) / 180;
const CENTRE = raDecToVec(140, -25);
const ORDER = 9;
const COARSE = 4;

function flatMap(): FlatSkymap {
  const nside = 2 ** ORDER;
  const probability = new Float64Array(12 * nside * nside);
  let total = 0;
  for (let i = 0; i < probability.length; i++) {
    const [x, y, z] = pix2vec_nest(nside, i);
    const cos = Math.min(1, x * CENTRE[0] + y * CENTRE[1] + z * CENTRE[2]);
    const p = Math.exp(-(2 * (1 - cos)) / (2 * SIGMA_RAD * SIGMA_RAD)); // chord² ≈ angle² near the centre
    probability[i] = p;
    total += p;
  }
  for (let i = 0; i < probability.length; i++) probability[i] = (probability[i] ?? 0) / total;
  return { layout: "flat-nested", nside, order: ORDER, probability };
}

/** Same sky: each order-4 cell stays whole where it holds under 1e-7, else splits into its order-9 pixels. */
function multiOrderMap(flat: FlatSkymap): MultiOrderSkymap {
  const span = POW4[ORDER - COARSE] ?? 1;
  const order: number[] = [];
  const ipix: number[] = [];
  const prob: number[] = [];
  for (let cell = 0; cell < 12 * (POW4[COARSE] ?? 1); cell++) {
    let sum = 0;
    for (let k = 0; k < span; k++) sum += flat.probability[cell * span + k] ?? 0;
    if (sum < 1e-7) {
      order.push(COARSE);
      ipix.push(cell);
      prob.push(sum);
      continue;
    }
    for (let k = 0; k < span; k++) {
      order.push(ORDER);
      ipix.push(cell * span + k);
      prob.push(flat.probability[cell * span + k] ?? 0);
    }
  }
  const probability = Float64Array.from(prob);
  const densityPerSr = probability.map((p, i) => p / pixelAreaSr(order[i] ?? 0));
  return { layout: "multiorder", maxOrder: ORDER, order: Uint8Array.from(order), ipix: Float64Array.from(ipix), probability, densityPerSr };
}

const instruments: Array<{ name: string; footprint: Footprint }> = [0.5, 3, 10, 50].map((areaDeg2) => ({
  name: `${areaDeg2} deg²`,
  footprint: { shape: "rectangle", widthDeg: Math.sqrt(areaDeg2), heightDeg: Math.sqrt(areaDeg2) },
}));

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? (s[m] ?? 0) : ((s[m - 1] ?? 0) + (s[m] ?? 0)) / 2;
};

function run(label: string, map: SkymapMap): void {
  const area90 = map.layout === "multiorder"
    ? credibleArea(map.densityPerSr, map.probability, Float64Array.from(map.order, (o) => pixelAreaSr(o) * SR_TO_DEG2), 0.9)
    : credibleArea(map.probability, map.probability, (4 * Math.PI * SR_TO_DEG2) / map.probability.length, 0.9);
  console.log(`\n${label}: ${map.probability.length} pixels, 90 % region ${area90.toFixed(0)} deg²`);
  const wall = instruments.map(() => [] as number[]);
  const cpu = instruments.map(() => [] as number[]);
  const allWall: number[] = [];
  const allCpu: number[] = [];
  for (let r = 0; r < repeats; r++) {
    let allMs = 0;
    let allCpuMs = 0;
    const rows: string[] = [];
    for (const [k, { name, footprint }] of instruments.entries()) {
      const cpuStart = process.cpuUsage();
      const start = performance.now();
      const plan = greedyPlan(map, footprint, { level: 0.9, maxPointings: 500 });
      const ms = performance.now() - start;
      const used = process.cpuUsage(cpuStart);
      const cpuMs = (used.user + used.system) / 1000;
      wall[k]?.push(ms);
      cpu[k]?.push(cpuMs);
      allMs += ms;
      allCpuMs += cpuMs;
      rows.push(`  ${name.padEnd(9)} ${ms.toFixed(0).padStart(5)} ms (CPU ${cpuMs.toFixed(0).padStart(4)} ms)  ${String(plan.pointings.length).padStart(3)} pointings of ${plan.candidateCount} candidates, covers ${plan.totalProbability.toFixed(3)}`);
    }
    allWall.push(allMs);
    allCpu.push(allCpuMs);
    console.log(`run ${r + 1}: all four ${allMs.toFixed(0)} ms (CPU ${allCpuMs.toFixed(0)} ms), peak RSS ${(process.memoryUsage().rss / 2 ** 20).toFixed(0)} MB`);
    for (const row of rows) console.log(row);
  }
  const cells = instruments.map(({ name }, k) => `${name} ${median(wall[k] ?? []).toFixed(0)} (${median(cpu[k] ?? []).toFixed(0)})`);
  console.log(`median of ${repeats}, wall (CPU) ms: ${cells.join(", ")}; all four ${median(allWall).toFixed(0)} (${median(allCpu).toFixed(0)})`);
}

const flat = flatMap();
run("flat nside 512", flat);
run("multi-order (orders 4 and 9)", multiOrderMap(flat));
console.log(`\npeak RSS over the whole run ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB; load average ${os.loadavg().map((l) => l.toFixed(2)).join(" ")}`);
