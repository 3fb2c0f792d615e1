/**
 * Galaxy catalogue speed (issue 19). `npm run bench:galaxies [-- rows]` (default 1 000 000):
 * 1. import: a CSV of `rows` fictional galaxies, generated while it streams (never whole in memory), sent as a
 *    multipart body through the import service into a fresh SQLite file; prints the time and the process's peak
 *    RSS and heap above the start (target: 1e6 rows under 60 s, under 500 MB);
 * 2. ranking: all those galaxies lie in a cap of 1000 deg², the 90 % region of a Gaussian 3D map at nside 256;
 *    prints the time to read the region's cells from the catalogue and rank them, and the pure ranking alone
 *    (target: under 500 ms). Figures only, no assertions; the machine is shared, so they are noisy.
 */
import { mkdtempSync, rmSync } from "node:fs";
import { cpus, loadavg, tmpdir } from "node:os";
import path from "node:path";
import { closeDb, getDb } from "@/db";
import { migrateDatabase } from "@/db/migrate";
import { users } from "@/db/schema";
import { toSessionUser } from "@/lib/auth/roles";
import { packsInCells } from "@/lib/data/catalogues";
import { unpack } from "@/lib/galaxies/pack";
import { rankGalaxies, regionCells } from "@/lib/galaxies/rank";
import { SeededRandom } from "@/lib/physics/random";
import { importCatalogue } from "@/lib/services/import-catalogue";
import { ansatzNorm } from "@/lib/skymap/distance";
import { pix2vec_nest, raDecToVec, vecToRaDec } from "@/lib/skymap/healpix";
import { credibleDensityThreshold } from "@/lib/skymap/region-threshold";
import type { FlatSkymap } from "@/lib/skymap/types";

const rows = Number(process.argv[2] ?? 1_000_000);
const CENTRE = { raDeg: 140, decDeg: -25 };
// a cap of 1000 deg²: 2π(1 − cos r) sr; the Gaussian's 90 % disc has area 2πσ² ln 10
const CAP_COS = 1 - 1000 / (2 * Math.PI * (180 / Math.PI) ** 2);
const SIGMA_RAD = (Math.sqrt(1000 / (2 * Math.PI * Math.LN10)) * Math.PI) / 180;
const ORDER = 8;

function map3d(): FlatSkymap {
  const nside = 2 ** ORDER;
  const n = 12 * nside * nside;
  const c = raDecToVec(CENTRE.raDeg, CENTRE.decDeg);
  const probability = new Float64Array(n);
  const muMpc = new Float64Array(n);
  const sigmaMpc = new Float64Array(n);
  const normPerMpc2 = new Float64Array(n);
  let total = 0;
  for (let i = 0; i < n; i++) {
    const [x, y, z] = pix2vec_nest(nside, i);
    const cos = Math.min(1, x * c[0] + y * c[1] + z * c[2]);
    probability[i] = Math.exp(-(2 * (1 - cos)) / (2 * SIGMA_RAD * SIGMA_RAD));
    total += probability[i] ?? 0;
    muMpc[i] = 180 + 40 * x;
    sigmaMpc[i] = 45 + 10 * z;
    normPerMpc2[i] = ansatzNorm(muMpc[i] ?? 0, sigmaMpc[i] ?? 1);
  }
  for (let i = 0; i < n; i++) probability[i] = (probability[i] ?? 0) / total;
  return { layout: "flat-nested", nside, order: ORDER, probability, distance: { muMpc, sigmaMpc, normPerMpc2 } };
}

/** A point uniform in the cap around CENTRE: cos of the offset uniform in [CAP_COS, 1], then rotated. */
function capPoint(random: SeededRandom): { raDeg: number; decDeg: number } {
  const cosT = CAP_COS + (1 - CAP_COS) * random.uniform();
  const sinT = Math.sqrt(1 - cosT * cosT);
  const phi = 2 * Math.PI * random.uniform();
  const c = raDecToVec(CENTRE.raDeg, CENTRE.decDeg);
  // orthonormal east/north at the centre
  const east = [-Math.sin((CENTRE.raDeg * Math.PI) / 180), Math.cos((CENTRE.raDeg * Math.PI) / 180), 0] as const;
  const north = [c[1] * east[2] - c[2] * east[1], c[2] * east[0] - c[0] * east[2], c[0] * east[1] - c[1] * east[0]] as const;
  const v = [0, 1, 2].map((k) => cosT * (c[k] ?? 0) + sinT * (Math.cos(phi) * (east[k] ?? 0) + Math.sin(phi) * (north[k] ?? 0))) as [number, number, number];
  return vecToRaDec(v);
}

/** The CSV as a stream of 64 kB chunks, made as it is read. */
function csvStream(count: number, boundary: string): ReadableStream<Uint8Array> {
  const random = new SeededRandom("bench-galaxies");
  const encoder = new TextEncoder();
  let made = -1;
  return new ReadableStream<Uint8Array>({
    pull(controller) {
      if (made === -1) {
        controller.enqueue(encoder.encode(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="bench.csv"\r\nContent-Type: text/csv\r\n\r\nname,raDeg,decDeg,distanceMpc,weight\n`));
        made = 0;
        return;
      }
      if (made >= count) {
        controller.enqueue(encoder.encode(`\r\n--${boundary}\r\nContent-Disposition: form-data; name="name"\r\n\r\nBench catalogue\r\n--${boundary}--\r\n`));
        controller.close();
        return;
      }
      let text = "";
      for (let k = 0; k < 1000 && made < count; k++, made++) {
        const p = capPoint(random);
        text += `BX-${made},${p.raDeg.toFixed(6)},${p.decDeg.toFixed(6)},${(5 + 400 * random.uniform()).toFixed(3)},${Math.exp(0.7 * random.normal()).toFixed(4)}\n`;
      }
      controller.enqueue(encoder.encode(text));
    },
  });
}

const cpuSeconds = (u: NodeJS.CpuUsage) => (u.user + u.system) / 1e6;

async function main() {
  const dir = mkdtempSync(path.join(tmpdir(), "chirpdesk-bench-galaxies-"));
  process.env.DATABASE_URL = `file:${path.join(dir, "bench.db")}`;
  try {
    const db = await getDb();
    await migrateDatabase(db);
    const [user] = await db.insert(users).values({ email: "bench@example.test", name: "Bench Coordinator", role: "coordinator", initials: "BC", passwordHash: "x" }).returning();
    const boundary = "benchboundary7d1f";
    const req = new Request("http://localhost/api/v1/catalogues", {
      method: "POST",
      body: csvStream(rows, boundary),
      headers: { "content-type": `multipart/form-data; boundary=${boundary}` },
      duplex: "half",
    } as RequestInit & { duplex: "half" });

    global.gc?.();
    const start = process.memoryUsage();
    let peakRss = start.rss;
    let peakHeap = start.heapUsed;
    const sampler = setInterval(() => {
      const m = process.memoryUsage();
      peakRss = Math.max(peakRss, m.rss);
      peakHeap = Math.max(peakHeap, m.heapUsed);
    }, 20);
    const t0 = performance.now();
    const cpu0 = process.cpuUsage();
    const imported = await importCatalogue(toSessionUser(user!), req, { now: new Date() });
    const importMs = performance.now() - t0;
    const importCpu = cpuSeconds(process.cpuUsage(cpu0));
    clearInterval(sampler);
    const mb = (b: number) => (b / 1024 / 1024).toFixed(0);
    console.log(`machine load (1-min average) ${loadavg()[0]?.toFixed(1)} on ${cpus().length} cores; CPU seconds are this process's own (SQLite runs in it), less sensitive to the load`);
    console.log(`import: ${imported.rows} rows in ${(importMs / 1000).toFixed(1)} s wall, ${importCpu.toFixed(1)} s CPU (CSV generation included) (${Math.round(imported.rows / (importMs / 1000))} rows/s); peak RSS ${mb(peakRss)} MB (${mb(peakRss - start.rss)} MB above the start), peak heap ${mb(peakHeap)} MB`);

    const map = map3d();
    for (let run = 0; run < 3; run++) {
      const t1 = performance.now();
      const c1 = process.cpuUsage();
      const threshold = credibleDensityThreshold(map, 0.9);
      const cells = regionCells(map, 0.9, threshold);
      const found = unpack(await packsInCells(db, imported.id, cells));
      const t2 = performance.now();
      const ranking = rankGalaxies(map, found, { level: 0.9, limit: 100, threshold });
      const t3 = performance.now();
      const rankCpu = cpuSeconds(process.cpuUsage(c1));
      console.log(
        `ranking run ${run + 1}: ${cells.length} cells, ${found.count} rows read in ${(t2 - t1).toFixed(0)} ms, ranked in ${(t3 - t2).toFixed(0)} ms ` +
          `(${ranking.considered} inside the 90 % region); total ${(t3 - t1).toFixed(0)} ms wall, ${(rankCpu * 1000).toFixed(0)} ms CPU`,
      );
    }
  } finally {
    await closeDb();
    rmSync(dir, { recursive: true, force: true });
  }
}

void main();
