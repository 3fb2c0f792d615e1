import type { CandidateVisibility } from "@/lib/data/visibility";
import { formatShare } from "./format";
import { rgbCss } from "./query-keys";
import { TimeRange } from "./time-range";

/** Per site: the share of the 90 % region observable during the coming night, the best window and the Moon. */
export function VisibilityTable({
  visibility,
  colours,
  timeZone,
}: {
  visibility: CandidateVisibility;
  colours: ReadonlyMap<string, readonly [number, number, number]>;
  timeZone: string;
}) {
  if (visibility.rows.length === 0) {
    return <p className="text-sm text-muted">No observing sites are defined yet; coordinators add them on the Sites page.</p>;
  }
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm" data-testid="visibility-table">
        <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-muted">
          <tr>
            <th className="py-1.5 pr-3 font-medium">Site</th>
            <th className="py-1.5 pr-3 font-medium">Astronomical night</th>
            <th className="py-1.5 pr-3 text-right font-medium" title="Share of the 90 % region's probability that reaches the site's altitude limit at some time during the night">
              Observable
            </th>
            <th className="py-1.5 pr-3 font-medium">Best window</th>
            <th className="py-1.5 font-medium">Moon</th>
          </tr>
        </thead>
        <tbody>
          {visibility.rows.map((row) => {
            const colour = colours.get(row.site.code);
            return (
              <tr key={row.site.id} className="border-b border-line last:border-0">
                <td className="py-1.5 pr-3">
                  <span className="inline-flex items-center gap-1.5">
                    {colour ? <span aria-hidden className="h-0 w-4 border-t-2 border-dashed" style={{ borderColor: rgbCss(colour) }} /> : null}
                    <span className="font-mono">{row.site.code}</span>
                    <span className="text-muted">{row.site.name}</span>
                  </span>
                  <span className="block text-xs text-faint">above {row.site.minAltitudeDeg}° · {row.site.fieldOfViewDeg2}&nbsp;deg² field</span>
                </td>
                <td className="py-1.5 pr-3 text-xs">
                  {row.nightStart && row.nightEnd ? (
                    <>
                      <TimeRange start={row.nightStart} end={row.nightEnd} timeZone={timeZone} />
                      {row.nightEndCapped ? <span className="block text-faint">polar night: shown for 24 h</span> : null}
                    </>
                  ) : (
                    <span className="text-muted">none within 24 h</span>
                  )}
                </td>
                <td className="py-1.5 pr-3 text-right font-mono">
                  <span className={row.observableProbability >= 0.5 ? "text-ok" : row.observableProbability > 0 ? "text-warn" : "text-faint"}>
                    {formatShare(row.observableProbability)}
                  </span>
                </td>
                <td className="py-1.5 pr-3 text-xs">
                  {row.bestWindow ? (
                    <>
                      <TimeRange start={row.bestWindow.start} end={row.bestWindow.end} timeZone={timeZone} />
                      <span className="block text-faint">up to {formatShare(row.bestWindow.probabilityAboveLimit)} at once</span>
                    </>
                  ) : (
                    <span className="text-faint">—</span>
                  )}
                </td>
                <td className="py-1.5 text-xs">
                  {row.moonSeparationDeg === null ? "—" : `${Math.round(row.moonSeparationDeg)}° away`}
                  <span className="block text-faint">{formatShare(row.moonIllumination)} lit</span>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
