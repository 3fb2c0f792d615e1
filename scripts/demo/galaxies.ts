import { importCatalogueCsv, type ImportedCatalogue } from "@/lib/services/import-catalogue";
import { SeededRandom } from "@/lib/physics/random";

/**
 * The demo's fictional galaxy catalogue, made at seed time: about 100 000 galaxies, most in groups (a few of them
 * inside the demo localisation's two lobes) and the rest a field population uniform in volume, all from one seeded
 * generator so every seed is the same. Names, positions and weights are invented.
 */
export const DEMO_GALAXY_COUNT = 100_000;
const GROUP_SHARE = 0.7;
const MAX_DISTANCE_MPC = 450;
/** groups placed in the demo map's lobes (scripts/demo/demo-localisation-3d.multiorder.fits.gz): ra, dec, Mpc */
const LOBE_GROUPS: ReadonlyArray<readonly [number, number, number]> = [
  [123.4, -35.0, 125],
  [121.0, -33.0, 160],
  [151.0, -18.0, 110],
  [148.5, -20.5, 175],
];

const DEG = Math.PI / 180;

/** A position at angular distance `offsetRad` in direction `angle` from (ra, dec), on the sphere. */
function offset(raDeg: number, decDeg: number, offsetRad: number, angle: number): [number, number] {
  const dec0 = decDeg * DEG;
  const sinDec = Math.sin(dec0) * Math.cos(offsetRad) + Math.cos(dec0) * Math.sin(offsetRad) * Math.cos(angle);
  const dec = Math.asin(Math.max(-1, Math.min(1, sinDec)));
  const ra = raDeg * DEG + Math.atan2(Math.sin(angle) * Math.sin(offsetRad) * Math.cos(dec0), Math.cos(offsetRad) - Math.sin(dec0) * sinDec);
  return [(((ra / DEG) % 360) + 360) % 360, dec / DEG];
}

interface Group {
  raDeg: number;
  decDeg: number;
  distanceMpc: number;
  members: number;
  /** physical radius of the group, Mpc */
  radiusMpc: number;
}

function groups(random: SeededRandom, members: number): Group[] {
  const out: Group[] = LOBE_GROUPS.map(([raDeg, decDeg, distanceMpc]) => ({ raDeg, decDeg, distanceMpc, members: 0, radiusMpc: 1.5 }));
  for (let i = 0; i < 600; i++) {
    const raDeg = 360 * random.uniform();
    const decDeg = Math.asin(2 * random.uniform() - 1) / DEG;
    out.push({ raDeg, decDeg, distanceMpc: MAX_DISTANCE_MPC * Math.cbrt(random.uniform()), members: 0, radiusMpc: 0.5 + 2 * random.uniform() });
  }
  // sizes from a Pareto law (index 1.5): a few rich groups, many poor ones; the lobe groups are rich
  const raw = out.map((_, i) => (i < LOBE_GROUPS.length ? 8 : 1) * random.uniform() ** (-1 / 1.5));
  const total = raw.reduce((a, b) => a + b, 0);
  let left = members;
  out.forEach((g, i) => {
    g.members = i === out.length - 1 ? left : Math.min(left, Math.round((members * (raw[i] ?? 0)) / total));
    left -= g.members;
  });
  return out;
}

function row(name: string, raDeg: number, decDeg: number, distanceMpc: number, weight: number): string {
  return `${name},${raDeg.toFixed(5)},${decDeg.toFixed(5)},${distanceMpc.toFixed(2)},${weight.toFixed(4)}\n`;
}

/** The catalogue as CSV text in chunks of about 1000 rows, header first. */
export function* demoGalaxyCsv(count = DEMO_GALAXY_COUNT, seed = "chirpdesk-demo-galaxies"): Generator<string> {
  const random = new SeededRandom(seed);
  const inGroups = Math.round(count * GROUP_SHARE);
  let made = 0;
  let chunk = "name,raDeg,decDeg,distanceMpc,weight\n";
  const emit = (line: string) => {
    chunk += line;
    made += 1;
  };
  for (const g of groups(random, inGroups)) {
    for (let k = 0; k < g.members; k++) {
      const r = Math.abs(random.normal()) * g.radiusMpc;
      const [raDeg, decDeg] = offset(g.raDeg, g.decDeg, Math.atan(r / g.distanceMpc), 2 * Math.PI * random.uniform());
      const distanceMpc = Math.max(1, g.distanceMpc + g.radiusMpc * random.normal());
      emit(row(`CDG-${String(made + 1).padStart(6, "0")}`, raDeg, decDeg, distanceMpc, Math.exp(0.8 * random.normal()) * (k === 0 ? 5 : 1)));
      if (made % 1000 === 0) {
        yield chunk;
        chunk = "";
      }
    }
  }
  while (made < count) {
    const raDeg = 360 * random.uniform();
    const decDeg = Math.asin(2 * random.uniform() - 1) / DEG;
    emit(row(`CDG-${String(made + 1).padStart(6, "0")}`, raDeg, decDeg, Math.max(1, MAX_DISTANCE_MPC * Math.cbrt(random.uniform())), Math.exp(0.8 * random.normal())));
    if (made % 1000 === 0) {
      yield chunk;
      chunk = "";
    }
  }
  if (chunk) yield chunk;
}

async function* bytes(chunks: Iterable<string>): AsyncGenerator<Uint8Array> {
  const encoder = new TextEncoder();
  for (const c of chunks) yield encoder.encode(c);
}

/** Imports the demo catalogue through the same checks and storage as an upload; it becomes the default. */
export async function seedDemoCatalogue(now: Date): Promise<ImportedCatalogue> {
  return importCatalogueCsv(bytes(demoGalaxyCsv()), { name: "Demo galaxies (fictional)", now });
}
