import { footprintOutline } from "@/lib/skymap/footprint";
import type { PlanRecord } from "@/lib/plans/record";
import type { Rgb } from "./raster";

/** One planned tile to draw: its outline on the sky, its number, and its site's colour and line pattern. */
export interface SkyFootprint {
  key: string;
  outline: Array<[number, number]>;
  centre: [number, number];
  index: number;
  siteCode: string;
  colour: Rgb;
  dash: string;
}

/**
 * Line patterns per site, in the same site order as the colours, so two sites differ in pattern as well as in colour
 * (solid, dashed, dotted, dash-dot, long dash, dash-dot-dot).
 */
export const sitePatterns = ["", "6 3", "1.5 2.5", "7 2.5 1.5 2.5", "11 4", "6 2 1.5 2 1.5 2"] as const;

export interface SiteStyle {
  colour: Rgb;
  dash: string;
}

/** Colour and pattern for each site code, by code order (the same order the night bands use for colours). */
export function siteStyles(codes: Iterable<string>, colours: ReadonlyArray<Rgb>): Map<string, SiteStyle> {
  const sorted = [...new Set(codes)].sort();
  return new Map(sorted.map((code, i) => [code, { colour: colours[i % colours.length] ?? [255, 255, 255], dash: sitePatterns[i % sitePatterns.length] ?? "" }]));
}

/** Every pointing of the open plans, as outlines (a rectangle's great-circle edges; a circle in 36 steps). */
export function planFootprints(plans: readonly PlanRecord[], styles: ReadonlyMap<string, SiteStyle>): SkyFootprint[] {
  const out: SkyFootprint[] = [];
  for (const plan of plans) {
    if (plan.closedAt) continue;
    const code = plan.site?.code ?? "?";
    const style = styles.get(code) ?? { colour: [255, 255, 255] as Rgb, dash: "" };
    for (const p of plan.pointings) {
      out.push({
        key: p.id,
        outline: footprintOutline(plan.footprint, p.raDeg, p.decDeg).map((q) => [q.raDeg, q.decDeg]),
        centre: [p.raDeg, p.decDeg],
        index: p.index,
        siteCode: code,
        ...style,
      });
    }
  }
  return out;
}
