/** Synthetic chirp tracks from the Peters & Mathews 1963 relations, with optional relative Gaussian noise. */
import { chirpFrequencyAt } from "@/lib/physics/chirp";
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
