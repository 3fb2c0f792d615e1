/** Synthetic chirp tracks from the Peters & Mathews 1963 relations, with optional relative Gaussian noise. */
import { chirpFrequencyAt, chirpFrequencyDerivative } from "@/lib/physics/chirp";
import { SeededRandom } from "@/lib/physics/random";

export interface SyntheticTrack {
  t: number[];
  f: number[];
  fSigma: number[];
}

export function syntheticTimeTrack(options: {
  chirpMass: number;
  tcS: number;
  startS: number;
  endS: number;
  samples: number;
  relativeNoise?: number;
  seed?: string;
}): SyntheticTrack {
  const random = new SeededRandom(options.seed ?? "track");
  const noise = options.relativeNoise ?? 0;
  const track: SyntheticTrack = { t: [], f: [], fSigma: [] };
  for (let i = 0; i < options.samples; i++) {
    const t = options.startS + ((options.endS - options.startS) * i) / (options.samples - 1);
    const f = chirpFrequencyAt(options.chirpMass, options.tcS, t);
    track.t.push(t);
    track.f.push(f * (1 + noise * random.normal()));
    track.fSigma.push(noise * f);
  }
  return track;
}

export function syntheticDerivativeTrack(options: {
  chirpMass: number;
  lowHz: number;
  highHz: number;
  samples: number;
  relativeNoise?: number;
  seed?: string;
}): { f: number[]; dfdt: number[]; dfdtSigma: number[] } {
  const random = new SeededRandom(options.seed ?? "derivative");
  const noise = options.relativeNoise ?? 0;
  const track = { f: [] as number[], dfdt: [] as number[], dfdtSigma: [] as number[] };
  for (let i = 0; i < options.samples; i++) {
    const f = options.lowHz * (options.highHz / options.lowHz) ** (i / (options.samples - 1));
    const dfdt = chirpFrequencyDerivative(options.chirpMass, f);
    track.f.push(f);
    track.dfdt.push(dfdt * (1 + noise * random.normal()));
    track.dfdtSigma.push(noise * dfdt);
  }
  return track;
}
