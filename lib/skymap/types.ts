import type { DistanceLayers } from "./distance";

export type SkymapLayout = "flat-ring" | "flat-nested" | "multiorder";

/** A full-sky map with one probability per pixel, kept in the file's own ordering. */
export interface FlatSkymap {
  layout: "flat-ring" | "flat-nested";
  nside: number;
  order: number;
  /** Probability per pixel, normalised to a total of 1. */
  probability: Float64Array;
  /** DISTMU, DISTSIGMA, DISTNORM when the file has them (3D maps), in the same pixel order. */
  distance?: DistanceLayers;
}

/** A multi-order (NUNIQ) map; arrays are parallel, one entry per pixel in file order. */
export interface MultiOrderSkymap {
  layout: "multiorder";
  maxOrder: number;
  order: Uint8Array;
  /** NESTED index of each pixel at its own order. */
  ipix: Float64Array;
  /** Probability per pixel (density × pixel area), normalised to a total of 1. */
  probability: Float64Array;
  /** Probability per steradian, with the same normalisation. */
  densityPerSr: Float64Array;
  /** DISTMU, DISTSIGMA, DISTNORM when the file has them (3D maps), parallel to the other arrays. */
  distance?: DistanceLayers;
}

export type SkymapMap = FlatSkymap | MultiOrderSkymap;

export interface SkyPosition {
  raDeg: number;
  decDeg: number;
}

export interface SkymapSummary {
  /** Sum of the file's probabilities before normalising. */
  totalProbability: number;
  /** True when the total differed from 1 by more than 1e-3 (a warning says so). */
  normalised: boolean;
  warnings: string[];
  area50Deg2: number;
  area90Deg2: number;
  /** Centre of the pixel with the highest probability density. */
  peak: SkyPosition;
  layout: SkymapLayout;
  /** Flat maps only. */
  nside?: number;
  /** Multi-order maps only. */
  maxOrder?: number;
  pixelCount: number;
  /** Distance summary of 3D maps (Singer et al. 2016 ansatz); absent for maps without distance columns. */
  distance?: DistanceSummary;
}

export interface DistanceSummary {
  /** Over the whole map (the marginal distance distribution). */
  meanMpc: number;
  stdMpc: number;
  /** In the most probable pixel; null when that pixel carries no distance. */
  atPeak: { meanMpc: number; stdMpc: number } | null;
  coveredProbability: number;
}

/** A probability sample of the credible region, for visibility calculations. */
export interface RegionPoint {
  raDeg: number;
  decDeg: number;
  prob: number;
}
