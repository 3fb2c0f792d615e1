import { redshiftFromLuminosityDistance } from "@/lib/physics";
import { round, type FeedRandom } from "./random";

export type FakeSourceClass = "bns" | "nsbh" | "bbh";

/** What "really" happened, in our invented universe; the feed reports noisy estimates of it. */
export interface FakeSource {
  sourceClass: FakeSourceClass;
  mass1SourceFrame: number;
  mass2SourceFrame: number;
  distanceMpc: number;
  redshift: number;
  spin1: number;
  spin2: number;
  networkSnr: number;
  falseAlarmRatePerYear: number;
  detectors: string[];
}

/**
 * A plausible invented population (not a fit to any catalogue): neutron stars near 1.35 M☉, black holes of
 * 5–50 M☉, sources uniform in Euclidean volume out to a class-dependent horizon.
 */
export function drawSource(rng: FeedRandom, sourceClass: FakeSourceClass, sites: readonly string[]): FakeSource {
  let m1: number;
  let m2: number;
  let horizonMpc: number;
  if (sourceClass === "bns") {
    m1 = rng.normalWithin(1.35, 0.12, 1.1, 2.1);
    m2 = rng.normalWithin(1.35, 0.12, 1.1, 2.1);
    horizonMpc = 250;
  } else if (sourceClass === "nsbh") {
    m1 = rng.uniform(5.5, 15);
    m2 = rng.normalWithin(1.4, 0.12, 1.1, 2.1);
    horizonMpc = 600;
  } else {
    m1 = rng.uniform(8, 50);
    m2 = Math.max(6, m1 * rng.uniform(0.35, 1));
    horizonMpc = 2500;
  }
  if (m2 > m1) [m1, m2] = [m2, m1];
  // Uniform in volume: d = d_max u^(1/3), with a near floor so nothing sits on top of the detectors.
  const distanceMpc = Math.max(20, horizonMpc * Math.cbrt(rng.next()));
  const neutronStarSpin = () => rng.uniform(-0.05, 0.05);
  const blackHoleSpin = () => rng.uniform(-0.4, 0.9);
  const detectors = sites.filter(() => rng.chance(0.8));
  if (detectors.length === 0) detectors.push(rng.pick(sites));
  // A louder signal for a nearer source, with scatter; the 8 floor is common practice for a detection threshold.
  const networkSnr = Math.min(80, Math.max(8, (9 * horizonMpc) / (2 * distanceMpc) + rng.normal(0, 1.5)));
  return {
    sourceClass,
    mass1SourceFrame: m1,
    mass2SourceFrame: m2,
    distanceMpc,
    redshift: redshiftFromLuminosityDistance(distanceMpc),
    spin1: sourceClass === "bns" ? neutronStarSpin() : blackHoleSpin(),
    spin2: sourceClass === "bbh" ? blackHoleSpin() : neutronStarSpin(),
    networkSnr: round(networkSnr, 2),
    falseAlarmRatePerYear: Number((10 ** rng.uniform(-7, 0.5)).toPrecision(3)),
    detectors,
  };
}
