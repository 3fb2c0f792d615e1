/**
 * Speed figures for lib/physics (issue 3): chirp fit of 10³–10⁵ samples and class probabilities at
 * 10³–10⁵ Monte Carlo samples. Prints medians of repeated runs; no assertions (speed is not a test).
 * Targets (issue 15): the 3.5PN fit of 10⁵ samples under 10 ms, computeDerived of a 1 000-sample track under 5 ms.
 * The machine is shared: read the CPU-time column and the minimum, not only the wall-clock median.
 * Run: npm run bench:physics
 */
import { chirpFrequencyAt, chirpMassFromComponents } from "@/lib/physics/chirp";
import { fitPnTrack } from "@/lib/physics/chirp-fit-pn";
import { fitTimeTrack } from "@/lib/physics/chirp-fit-time";
import { planck18DistanceTable } from "@/lib/physics/distance-table";
import { SeededRandom } from "@/lib/physics/random";
import { computeSourceClasses } from "@/lib/physics/source-class";
import { computeDerived, defaultPhysicsSettings } from "@/lib/physics";

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

/** Wall-clock median and minimum, plus the median CPU time of this process (robust when the machine is busy). */
function time(repeats: number, body: () => void): { medianMs: number; minMs: number; cpuMedianMs: number } {
  for (let i = 0; i < 3; i++) body(); // warm-up so the JIT has compiled the hot loops
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    body();
    wall.push(performance.now() - start);
    const used = process.cpuUsage(cpuStart);
    cpu.push((used.user + used.system) / 1000);
  }
  return { medianMs: median(wall), minMs: Math.min(...wall), cpuMedianMs: median(cpu) };
}

function noisyTrack(samples: number) {
  const chirpMass = chirpMassFromComponents(1.4, 1.3);
  const random = new SeededRandom(`bench-${samples}`);
  const t: number[] = [];
  const f: number[] = [];
  const fSigma: number[] = [];
  for (let i = 0; i < samples; i++) {
    const ti = -100 + (99.5 * i) / (samples - 1);
    const fi = chirpFrequencyAt(chirpMass, 0, ti);
    t.push(ti);
    f.push(fi * (1 + 0.01 * random.normal()));
    fSigma.push(0.01 * fi);
  }
  return { t, f, fSigma };
}

const format = (ms: number) => ms.toFixed(3).padStart(9);
console.log(`node ${process.version}; figures in ms: wall-clock median and minimum of repeated runs, and median CPU time`);
console.log("\nchirp-mass fit (f(t) track, 1 % noise, per-sample σ)");
for (const samples of [1_000, 10_000, 100_000]) {
  const track = noisyTrack(samples);
  const withSigma = time(samples >= 100_000 ? 31 : 101, () => fitTimeTrack(track));
  const withoutSigma = time(samples >= 100_000 ? 31 : 101, () => fitTimeTrack({ t: track.t, f: track.f }));
  console.log(`  ${String(samples).padStart(7)} samples: median ${format(withSigma.medianMs)}  min ${format(withSigma.minMs)}` +
    `  cpu ${format(withSigma.cpuMedianMs)}   | no σ (sandwich errors): median ${format(withoutSigma.medianMs)}  cpu ${format(withoutSigma.cpuMedianMs)}`);
}

console.log("\n3.5PN TaylorT4 chirp fit (masses 1.5 ± 0.2 + 1.3 ± 0.2 M☉ from the trigger, η spread propagated)");
const pnBinaryInput = { mass1: { mean: 1.5, sd: 0.2 }, mass2: { mean: 1.3, sd: 0.2 }, chi1: 0, chi2: 0 };
for (const samples of [1_000, 10_000, 100_000]) {
  const track = noisyTrack(samples);
  const withSigma = time(samples >= 100_000 ? 21 : 61, () => fitPnTrack(track, pnBinaryInput, "bench"));
  const withoutSigma = time(samples >= 100_000 ? 21 : 61, () => fitPnTrack({ t: track.t, f: track.f }, pnBinaryInput, "bench"));
  console.log(`  ${String(samples).padStart(7)} samples: median ${format(withSigma.medianMs)}  min ${format(withSigma.minMs)}` +
    `  cpu ${format(withSigma.cpuMedianMs)}   | no σ: median ${format(withoutSigma.medianMs)}  cpu ${format(withoutSigma.cpuMedianMs)}`);
}

console.log("\nclass probabilities (masses + distance, Planck 2018 redshift per sample)");
const buildStart = performance.now();
planck18DistanceTable();
console.log(`  distance table built once in ${(performance.now() - buildStart).toFixed(3)} ms`);
const classInput = {
  mass1DetectorFrame: { mean: 8, sd: 2 },
  mass2DetectorFrame: { mean: 1.6, sd: 0.4 },
  chi1: 0.6,
  chi2: 0,
  distanceMpc: { mean: 300, sd: 80 },
};
for (const sampleCount of [1_000, 10_000, 20_000, 100_000]) {
  const result = time(sampleCount >= 100_000 ? 21 : 61, () => {
    computeSourceClasses(classInput, { ...defaultPhysicsSettings, sampleCount }, "bench-seed");
  });
  console.log(`  ${String(sampleCount).padStart(7)} samples: median ${format(result.medianMs)}  min ${format(result.minMs)}  cpu ${format(result.cpuMedianMs)}`);
}

for (const samples of [1_000, 2_000]) {
  console.log(`\ncomputeDerived end to end (${samples}-sample track, 20 000 class samples, 3.5PN fit)`);
  const track = noisyTrack(samples);
  const whole = time(41, () => {
    computeDerived(
      {
        frequencyTrack: track,
        masses: { m1: { mean: 1.5, sd: 0.2 }, m2: { mean: 1.3, sd: 0.2 } },
        distanceMpc: { mean: 120, sd: 30 },
        secondsSinceEventTimeAtReceipt: -20,
        networkSnr: 12,
        falseAlarmRatePerYear: 0.01,
      },
      defaultPhysicsSettings,
      `bench/whole/${samples}`,
    );
  });
  console.log(`  median ${format(whole.medianMs)}  min ${format(whole.minMs)}  cpu ${format(whole.cpuMedianMs)}`);
}
