import { raDecToNest } from "./healpix-lookup";
import { nightBandContains, type NightBand } from "./night-band";
import { rampColour, type Rgb, type SkyPalette } from "./palette";

export type { Rgb } from "./palette";

/** What the raster needs of a display grid (lib/skymap/display-grid.ts): NESTED probabilities and credible levels. */
export interface RasterGrid {
  nside: number;
  probability: Float64Array;
  credibleLevel: Float64Array;
}

/** What lies under each canvas pixel: its HEALPix pixel (−1 outside the sky) and sky position. Depends only on the view. */
export interface PixelSamples {
  width: number;
  height: number;
  nside: number;
  nest: Int32Array;
  raDeg: Float32Array;
  decDeg: Float32Array;
}

export function samplePixels(width: number, height: number, nside: number, skyAt: (x: number, y: number) => [number, number] | null): PixelSamples {
  const nest = new Int32Array(width * height).fill(-1);
  const raDeg = new Float32Array(width * height);
  const decDeg = new Float32Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const sky = skyAt(x + 0.5, y + 0.5);
      if (!sky) continue;
      const k = y * width + x;
      const ra = ((sky[0] % 360) + 360) % 360;
      raDeg[k] = ra;
      decDeg[k] = sky[1];
      nest[k] = raDecToNest(nside, ra, sky[1]);
    }
  }
  return { width, height, nside, nest, raDeg, decDeg };
}

// 256-entry colour table of each palette's ramp, so painting allocates nothing per pixel
const luts = new WeakMap<SkyPalette, Uint8ClampedArray>();
function lutOf(palette: SkyPalette): Uint8ClampedArray {
  let table = luts.get(palette);
  if (!table) {
    table = new Uint8ClampedArray(256 * 3);
    for (let i = 0; i < 256; i++) table.set(rampColour(palette, Math.sqrt(i / 255)), 3 * i);
    luts.set(palette, table);
  }
  return table;
}

/** Contour marks per canvas pixel: 0 none, 1 the thin 90 % line, 2 the thick 50 % line. */
export function contourMarks(levelClass: Int8Array, width: number, height: number): Uint8Array {
  const marks = new Uint8Array(width * height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const k = y * width + x;
      const here = levelClass[k] ?? -1;
      if (here < 0) continue;
      const right = x + 1 < width ? (levelClass[k + 1] ?? -1) : here;
      const down = y + 1 < height ? (levelClass[k + width] ?? -1) : here;
      const crosses = (lim: number) => (right >= 0 && here <= lim !== right <= lim) || (down >= 0 && here <= lim !== down <= lim);
      if (crosses(0)) {
        // thick: the crossing pixel and the ones beyond it
        marks[k] = 2;
        if (x + 1 < width) marks[k + 1] = 2;
        if (y + 1 < height) marks[k + width] = 2;
      } else if (crosses(1) && (marks[k] ?? 0) === 0) marks[k] = 1;
    }
  }
  return marks;
}

/**
 * Paints the probability (square-root colour scale of p / p_max, transparent where negligible), the 50 % (thick)
 * and 90 % (thin) contours cased in the background colour (edges of {credible level ≤ 0.5} and {≤ 0.9}), and
 * dashed outlines of up to 8 sites' night-time bands.
 */
export function paint(
  samples: PixelSamples,
  grid: RasterGrid,
  bands: ReadonlyArray<NightBand & { colour: Rgb }>,
  palette: SkyPalette,
): Uint8ClampedArray<ArrayBuffer> {
  const { width, height, nest } = samples;
  const lut = lutOf(palette);
  const rgba = new Uint8ClampedArray(width * height * 4);
  const levelClass = new Int8Array(width * height).fill(-1);
  const bandMask = new Uint8Array(width * height);
  const drawn = bands.slice(0, 8);
  let pmax = 0;
  for (let i = 0; i < grid.probability.length; i++) pmax = Math.max(pmax, grid.probability[i] ?? 0);

  for (let k = 0; k < nest.length; k++) {
    const pix = nest[k] ?? -1;
    if (pix < 0) continue;
    const level = grid.credibleLevel[pix] ?? 1;
    levelClass[k] = level <= 0.5 ? 0 : level <= 0.9 ? 1 : 2;
    for (let b = 0; b < drawn.length; b++) {
      if (nightBandContains(drawn[b] as NightBand, samples.raDeg[k] ?? 0, samples.decDeg[k] ?? 0)) bandMask[k] = (bandMask[k] ?? 0) | (1 << b);
    }
    const t = pmax > 0 ? (grid.probability[pix] ?? 0) / pmax : 0;
    if (t < 0.004) continue;
    const i = Math.min(255, Math.round(t * 255));
    rgba[4 * k] = lut[3 * i] ?? 0;
    rgba[4 * k + 1] = lut[3 * i + 1] ?? 0;
    rgba[4 * k + 2] = lut[3 * i + 2] ?? 0;
    rgba[4 * k + 3] = Math.round(255 * Math.min(1, 0.25 + t * 1.5));
  }

  const put = (k: number, c: Rgb) => {
    rgba[4 * k] = c[0];
    rgba[4 * k + 1] = c[1];
    rgba[4 * k + 2] = c[2];
    rgba[4 * k + 3] = 255;
  };
  const marks = contourMarks(levelClass, width, height);
  const marked = (k: number) => (marks[k] ?? 0) > 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const k = y * width + x;
      if (marked(k)) put(k, palette.contour);
      else if ((x > 0 && marked(k - 1)) || (x + 1 < width && marked(k + 1)) || (y > 0 && marked(k - width)) || (y + 1 < height && marked(k + width))) {
        put(k, palette.casing); // the casing keeps the line legible over any ramp colour
      }
      if ((levelClass[k] ?? -1) < 0) continue;
      if (((x + y) >> 2) & 1) continue; // dashes: every other run of 4 pixels
      const mask = bandMask[k] ?? 0;
      const changed = (mask ^ (x + 1 < width ? (bandMask[k + 1] ?? 0) : mask)) | (mask ^ (y + 1 < height ? (bandMask[k + width] ?? 0) : mask));
      for (let b = 0; changed && b < drawn.length; b++) if (changed & (1 << b)) put(k, (drawn[b] as { colour: Rgb }).colour);
    }
  }
  return rgba;
}
