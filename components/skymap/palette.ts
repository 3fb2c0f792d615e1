/**
 * Chirpdesk's own sky-map look ("tidewater"): one sea-green → blue family in both themes, with lightness running
 * away from the page background as probability rises (pale to ink on the light theme, deep to pale on the dark
 * one), so the order reads by lightness alone for any colour vision. Contours are a warm colour outside that
 * family, drawn with a casing of the background colour: the 50 % line thick, the 90 % line thin.
 */
export type Rgb = readonly [number, number, number];
export type SkyTheme = "light" | "dark";

export interface SkyPalette {
  /** ramp stops from p/p_max = 0 to 1 */
  ramp: ReadonlyArray<readonly [number, Rgb]>;
  contour: Rgb;
  /** the thin casing either side of a contour line: the panel's background */
  casing: Rgb;
  background: Rgb;
}

export const skyPalettes: Record<SkyTheme, SkyPalette> = {
  light: {
    ramp: [
      [0, [205, 238, 232]],
      [0.35, [91, 182, 169]],
      [0.65, [42, 111, 151]],
      [1, [43, 31, 92]],
    ],
    contour: [180, 65, 15],
    casing: [255, 255, 255],
    background: [255, 255, 255],
  },
  dark: {
    ramp: [
      [0, [18, 60, 68]],
      [0.35, [31, 127, 122]],
      [0.65, [79, 193, 176]],
      [1, [227, 255, 244]],
    ],
    contour: [255, 179, 71],
    casing: [17, 23, 37],
    background: [17, 23, 37],
  },
};

export function skyThemeOf(resolvedTheme: string | undefined): SkyTheme {
  return resolvedTheme === "light" ? "light" : "dark";
}

/** The ramp colour at t in [0, 1] (clamped), linear between stops. */
export function rampColour(palette: SkyPalette, t: number): Rgb {
  const x = Math.min(1, Math.max(0, t));
  const { ramp } = palette;
  for (let i = 1; i < ramp.length; i++) {
    const [t1, c1] = ramp[i] as readonly [number, Rgb];
    const [t0, c0] = ramp[i - 1] as readonly [number, Rgb];
    if (x <= t1) {
      const f = (x - t0) / (t1 - t0);
      return [c0[0] + f * (c1[0] - c0[0]), c0[1] + f * (c1[1] - c0[1]), c0[2] + f * (c1[2] - c0[2])];
    }
  }
  return ramp[ramp.length - 1]?.[1] ?? [255, 255, 255];
}

/** WCAG 2.x relative luminance of an sRGB colour (W3C WCAG 2.1, "relative luminance"). */
export function relativeLuminance([r, g, b]: Rgb): number {
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.03928 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

/** WCAG 2.x contrast ratio, 1 to 21. */
export function contrastRatio(a: Rgb, b: Rgb): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (hi + 0.05) / (lo + 0.05);
}
