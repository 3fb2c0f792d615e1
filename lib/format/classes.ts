import type { SourceClass } from "@/db/schema/candidates";

/** Short class names as the literature writes them; "Gap" is the lower mass gap between NS and BH masses. */
export const classLabels: Record<SourceClass, string> = {
  bns: "BNS",
  nsbh: "NSBH",
  bbh: "BBH",
  lowerGap: "Gap",
};

export const classLongLabels: Record<SourceClass, string> = {
  bns: "Binary neutron star",
  nsbh: "Neutron star–black hole",
  bbh: "Binary black hole",
  lowerGap: "Lower mass gap",
};

/** Tailwind background classes of the class colours (design tokens in app/globals.css). */
export const classColourClasses: Record<SourceClass, string> = {
  bns: "bg-class-bns",
  nsbh: "bg-class-nsbh",
  bbh: "bg-class-bbh",
  lowerGap: "bg-class-gap",
};

export type ClassProbabilityMap = Record<SourceClass, number>;

/** The most probable class and its probability, or null when none is known. */
export function topClass(p: Partial<ClassProbabilityMap> | null): { cls: SourceClass; p: number } | null {
  if (!p) return null;
  let best: { cls: SourceClass; p: number } | null = null;
  for (const cls of ["bns", "nsbh", "bbh", "lowerGap"] as const) {
    const value = p[cls];
    if (typeof value === "number" && Number.isFinite(value) && (!best || value > best.p)) best = { cls, p: value };
  }
  return best;
}
