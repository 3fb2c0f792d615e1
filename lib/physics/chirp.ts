/**
 * Leading-order (Newtonian quadrupole) chirp relations. Chirp masses in solar masses, in whichever frame the
 * caller passes (detector frame when paired with observed frequencies/times), frequencies in Hz, times in s.
 */
import { SUN_MASS_TIME_S } from "./constants";

/** (256/5) π^(8/3): coefficient of f^(-8/3) = C (G𝓜/c³)^(5/3) (t_c − t), Peters & Mathews 1963. */
export const CHIRP_TIME_COEFFICIENT = (256 / 5) * Math.PI ** (8 / 3);

/** Chirp mass (m1 m2)^(3/5) / (m1 + m2)^(1/5) in the frame of the inputs; definition from Peters & Mathews 1963. */
export function chirpMassFromComponents(mass1Solar: number, mass2Solar: number): number {
  return (mass1Solar * mass2Solar) ** 0.6 / (mass1Solar + mass2Solar) ** 0.2;
}

/**
 * Time left to coalescence (s) from GW frequency f (Hz) for a detector-frame chirp mass:
 * τ = (5/256) (G𝓜/c³)^(−5/3) (π f)^(−8/3), Peters & Mathews 1963 (Maggiore 2008 Vol. 1 Eq. 4.21). NaN outside domain.
 */
export function timeToMergerSeconds(chirpMassDetectorFrame: number, frequencyHz: number): number {
  if (!(chirpMassDetectorFrame > 0) || !(frequencyHz > 0)) return Number.NaN;
  const chirpTimeS = SUN_MASS_TIME_S * chirpMassDetectorFrame;
  return (5 / 256) * chirpTimeS ** (-5 / 3) * (Math.PI * frequencyHz) ** (-8 / 3);
}

/**
 * GW frequency (Hz) at time tSeconds for coalescence at tcSeconds, inverse of the Peters & Mathews 1963 chirp:
 * f = (1/π) (5 / (256 (t_c − t)))^(3/8) (G𝓜/c³)^(−5/8). NaN at or after coalescence.
 */
export function chirpFrequencyAt(chirpMassDetectorFrame: number, tcSeconds: number, tSeconds: number): number {
  const remainingS = tcSeconds - tSeconds;
  if (!(chirpMassDetectorFrame > 0) || !(remainingS > 0)) return Number.NaN;
  const chirpTimeS = SUN_MASS_TIME_S * chirpMassDetectorFrame;
  return (1 / Math.PI) * (5 / (256 * remainingS)) ** (3 / 8) * chirpTimeS ** (-5 / 8);
}

/** Inverts (G𝓜/c³)^(5/3) = slope / coefficient to a chirp mass in solar masses, working in logs (no overflow). */
export function chirpMassFromLogAmplitude(logChirpTimeToFiveThirds: number): number {
  return Math.exp((3 / 5) * logChirpTimeToFiveThirds) / SUN_MASS_TIME_S;
}
