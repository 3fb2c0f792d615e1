import { cn } from "@/components/ui/cn";
import { contourColours, rampColour } from "./raster";
import { rgbCss } from "./query-keys";

const rampStops = Array.from({ length: 11 }, (_, i) => `${rgbCss(rampColour(i / 10))} ${i * 10}%`).join(", ");

export interface LegendSite {
  code: string;
  name: string;
  colour: readonly [number, number, number];
  hasNight: boolean;
  shown: boolean;
}

/** What the colours, lines and markers of the sky views mean; site chips show or hide each site's band. */
export function SkymapLegend({ sites, onToggle }: { sites: ReadonlyArray<LegendSite>; onToggle: (code: string) => void }) {
  return (
    <div className="space-y-3 text-xs">
      <dl className="space-y-1.5" aria-label="Legend">
        <div className="flex items-center gap-2">
          <dt className="h-2.5 w-14 shrink-0 rounded-sm" style={{ background: `linear-gradient(to right, ${rampStops})` }} />
          <dd className="text-muted">Probability per pixel, relative to the highest (square-root scale)</dd>
        </div>
        <div className="flex items-center gap-2">
          <dt className="h-0.5 w-14 shrink-0" style={{ background: rgbCss(contourColours.level50) }} />
          <dd className="text-muted">50 % credible region (greedy)</dd>
        </div>
        <div className="flex items-center gap-2">
          <dt className="h-0.5 w-14 shrink-0" style={{ background: rgbCss(contourColours.level90) }} />
          <dd className="text-muted">90 % credible region (greedy)</dd>
        </div>
        <div className="flex items-center gap-2">
          <dt className="flex w-14 shrink-0 items-center gap-1.5">
            <span className="h-3 w-3 rounded-full border border-[#a16207] bg-[#facc15]" />
            <span className="h-3 w-3 rounded-full border border-[#52525b] bg-[#d4d4d8]" />
            <span className="font-mono text-sm leading-none text-fg">+</span>
          </dt>
          <dd className="text-muted">Sun and Moon now (geocentric); + most probable position</dd>
        </div>
      </dl>
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
