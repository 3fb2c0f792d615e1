"use client";

import { useTheme } from "next-themes";
import { cn } from "@/components/ui/cn";
import { rampColour, skyPalettes, skyThemeOf, type SkyPalette } from "./palette";
import { rgbCss } from "./query-keys";

const rampStops = (palette: SkyPalette) => Array.from({ length: 11 }, (_, i) => `${rgbCss(rampColour(palette, i / 10))} ${i * 10}%`).join(", ");

/** A legend swatch of a contour line: the line in the contour colour between two casing lines. */
function ContourSwatch({ palette, thickPx }: { palette: SkyPalette; thickPx: number }) {
  return (
    <dt className="w-14 shrink-0" style={{ height: thickPx, background: rgbCss(palette.contour), boxShadow: `0 0 0 1px ${rgbCss(palette.casing)}` }} />
  );
}

export interface LegendSite {
  code: string;
  name: string;
  colour: readonly [number, number, number];
  hasNight: boolean;
  shown: boolean;
}

/** What the colours, lines and markers of the sky views mean; site chips show or hide each site's band. */
export interface LegendPlannedSite {
  code: string;
  colour: readonly [number, number, number];
  dash: string;
  count: number;
}

export function SkymapLegend({
  sites,
  onToggle,
  observedCount = 0,
  plannedSites = [],
}: {
  sites: ReadonlyArray<LegendSite>;
  onToggle: (code: string) => void;
  observedCount?: number;
  plannedSites?: ReadonlyArray<LegendPlannedSite>;
}) {
  const palette = skyPalettes[skyThemeOf(useTheme().resolvedTheme)];
  return (
    <div className="space-y-3 text-xs">
      <dl className="space-y-1.5" aria-label="Legend">
        <div className="flex items-center gap-2">
          <dt className="h-2.5 w-14 shrink-0 rounded-sm" style={{ background: `linear-gradient(to right, ${rampStops(palette)})` }} />
          <dd className="text-muted">Probability per pixel, relative to the highest (square-root scale)</dd>
        </div>
        <div className="flex items-center gap-2">
          <ContourSwatch palette={palette} thickPx={2} />
          <dd className="text-muted">Thick line: smallest region holding 50&nbsp;% of the probability</dd>
        </div>
        <div className="flex items-center gap-2">
          <ContourSwatch palette={palette} thickPx={1} />
          <dd className="text-muted">Thin line: smallest region holding 90&nbsp;%</dd>
        </div>
        <div className="flex items-center gap-2">
          <dt className="flex w-14 shrink-0 items-center gap-1.5">
            <span className="h-3 w-3 rounded-full border border-[#a16207] bg-[#facc15]" />
            <span className="h-3 w-3 rounded-full border border-[#52525b] bg-[#d4d4d8]" />
            <span className="font-mono text-sm leading-none text-fg">+</span>
          </dt>
          <dd className="text-muted">Sun and Moon now (geocentric); + most probable position</dd>
        </div>
        {observedCount ? (
          <div className="flex items-center gap-2">
            <dt className="h-3 w-14 shrink-0 border border-fg bg-fg/20" />
            <dd className="text-muted">
              Shaded, solid outline: observed footprints ({observedCount.toLocaleString("en-US")} exposures logged)
            </dd>
          </div>
        ) : null}
      </dl>
      {plannedSites.length ? (
        <div className="space-y-1.5" data-testid="planned-legend">
          <p className="text-muted">Outlined tiles: each site&apos;s planned pointings, one colour and line pattern per site (numbered in the zoomed view).</p>
          <ul className="flex flex-wrap gap-1.5">
            {plannedSites.map((s) => (
              <li key={s.code} className="inline-flex items-center gap-1.5 rounded border border-line px-2 py-0.5 font-mono">
                <svg aria-hidden width={22} height={6}>
                  <line x1={0} x2={22} y1={3} y2={3} stroke={rgbCss(s.colour)} strokeWidth={2} strokeDasharray={s.dash || undefined} />
                </svg>
                {s.code} · {s.count}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {sites.length ? (
        <div className="space-y-1.5">
          <p className="text-muted">
            Dashed outlines: the sky that rises above each site&apos;s altitude limit at some time during its coming astronomical night
            (Sun below −18°). Click a site to show or hide it.
          </p>
          <ul className="flex flex-wrap gap-1.5">
            {sites.map((s) => (
              <li key={s.code}>
                <button
                  type="button"
                  aria-pressed={s.shown}
                  disabled={!s.hasNight}
                  title={s.hasNight ? s.name : `${s.name}: no astronomical night within 24 h`}
                  onClick={() => onToggle(s.code)}
                  className={cn(
                    "inline-flex items-center gap-1.5 rounded border px-2 py-0.5 font-mono",
                    s.shown ? "border-line-strong bg-raised text-fg" : "border-line text-faint",
                    !s.hasNight && "cursor-not-allowed line-through",
                  )}
                >
                  <span aria-hidden className="h-0 w-4 border-t-2 border-dashed" style={{ borderColor: s.shown ? rgbCss(s.colour) : "currentColor" }} />
                  {s.code}
                </button>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
