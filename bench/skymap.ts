/**
 * Sky-map speed: credible areas (+ reading, validation, peak) of a flat nside-512 map (3.1 M pixels)
 * and of a ~19 000-pixel multi-order map, against healpy + numpy on the same files in the same run.
 * Targets (issue 8): multi-order under 50 ms; flat within 2× of healpy + numpy and under 400 MB.
 * Prints figures only.   npx tsx bench/skymap.ts [repeats]
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { analyseSkymap, type SkymapSummary } from "@/lib/skymap";

const repeats = Number(process.argv[2] ?? 5);
const script = fileURLToPath(new URL("../tests/fixtures/scripts/skymap_bench.py", import.meta.url));
const dir = mkdtempSync(path.join(tmpdir(), "skymap-bench-"));

interface PythonSide {
  firstMs: number;
  bestMs: number;
  area50Deg2: number;
  area90Deg2: number;
  peak: { raDeg: number; decDeg: number };
}

function python(args: string[]): string {
  return execFileSync("/usr/bin/python3", [script, ...args], { encoding: "utf8", maxBuffer: 1 << 20 });
}

function timeAnalyse(file: string): { firstMs: number; bestMs: number; summary: SkymapSummary; rssMB: number } {
  const times: number[] = [];
  let summary: SkymapSummary | undefined;
  let rssMB = 0;
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    const result = analyseSkymap(readFileSync(file)); // reading the file is timed, as read_map is
    times.push(performance.now() - start);
    if (!result.ok) throw new Error(`${file}: ${result.error.message}`);
    summary = result.summary;
    rssMB = Math.max(rssMB, process.memoryUsage().rss / 2 ** 20);
  }
  if (!summary) throw new Error("no repeats");
  return { firstMs: times[0] ?? 0, bestMs: Math.min(...times), summary, rssMB };
}

const fmt = (n: number, digits = 1) => n.toFixed(digits).padStart(9);

try {
  console.log(`generating inputs in ${dir} …`);
  console.log(python(["generate", dir]).trim());
  const flatFile = path.join(dir, "flat-n512.fits");
  const multiFile = path.join(dir, "multiorder.fits");

  const multi = timeAnalyse(multiFile);
  const flat = timeAnalyse(flatFile);
  const peakRssMB = process.resourceUsage().maxRSS / 1024;
  const py = JSON.parse(python(["measure", flatFile, multiFile, String(repeats)])) as {
    flat: PythonSide;
    multiorder: PythonSide;
    maxRssMB: number;
  };

  console.log(`\n${repeats} runs each; times in ms (read + validate + normalise + 50/90 % areas + peak)`);
  console.log("map          ours first  ours best  healpy first  healpy best  best ratio (ours/healpy)");
  for (const [name, ours, theirs] of [["flat n512", flat, py.flat], ["multi-order", multi, py.multiorder]] as const) {
    console.log(
      `${name.padEnd(12)}${fmt(ours.firstMs)}  ${fmt(ours.bestMs)}  ${fmt(theirs.firstMs, 1).padStart(12)}  ${fmt(theirs.bestMs).padStart(11)}  ${fmt(ours.bestMs / theirs.bestMs, 2)}`,
    );
    console.log(
      `${"".padEnd(12)}areas ours ${ours.summary.area50Deg2.toFixed(2)} / ${ours.summary.area90Deg2.toFixed(2)} deg², healpy ${theirs.area50Deg2.toFixed(2)} / ${theirs.area90Deg2.toFixed(2)} deg²`,
    );
  }
  console.log(`\npixels: flat ${flat.summary.pixelCount}, multi-order ${multi.summary.pixelCount}`);
  console.log(`memory: node peak RSS ${peakRssMB.toFixed(0)} MB (rss after runs ${flat.rssMB.toFixed(0)} MB); python ru_maxrss ${py.maxRssMB.toFixed(0)} MB`);
  console.log("targets: multi-order < 50 ms; flat ≤ 2× healpy+numpy and < 400 MB");
} finally {
  rmSync(dir, { recursive: true, force: true });
}
