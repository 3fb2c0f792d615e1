import { cn } from "@/components/ui/cn";
import { classColourClasses, classLongLabels } from "@/lib/format/classes";
import { formatPercent } from "@/lib/format/numbers";
import type { Derived } from "@/lib/physics/derived-types";

const order = ["bns", "nsbh", "bbh", "lowerGap"] as const;

/** Percentage points to two significant figures at most one decimal: the Monte Carlo error is a rough figure. */
export function formatSePoints(se: number): string {
  const points = se * 100;
  if (!Number.isFinite(points)) return "—";
  if (points === 0) return "0";
  if (points < 0.1) return "< 0.1";
  return points < 10 ? points.toFixed(1) : String(Math.round(points));
}

/**
 * Class probabilities with their binomial Monte Carlo standard error, beside them the probability of astrophysical
 * origin and each class times it (byClass), then the sample count and the p-astro inputs in words.
 */
export function SourceClassPanel({ derived }: { derived: Partial<Derived> }) {
  const p = derived.classProbabilities ?? null;
  const se = derived.classProbabilitiesSe ?? null;
  const astro = derived.astroProbability ?? null;
  const byClass = astro?.byClass ?? null;
  return (
    <div className="space-y-3" data-testid="source-class">
      {p ? (
        <table className="w-full table-fixed text-sm">
          <thead className="text-xs text-faint">
            <tr>
              <th scope="col" className="w-[38%] text-left font-normal">Class</th>
              <th scope="col" className="font-normal"><span className="sr-only">Bar</span></th>
              <th scope="col" className="w-[5.5rem] text-right font-normal" title="Class probability ± Monte Carlo standard error (percentage points)">P ± MC error</th>
              <th scope="col" className="w-[3.75rem] text-right font-normal" title="Class probability × probability of astrophysical origin">× p-astro</th>
            </tr>
          </thead>
          <tbody>
            {order.map((c) => (
              <tr key={c}>
                <th scope="row" className="py-0.5 text-left font-normal">
                  <span className="flex items-center gap-1.5">
                    <span aria-hidden className={cn("h-2.5 w-2.5 shrink-0 rounded-sm", classColourClasses[c])} />
                    <span className="min-w-0 break-words">{classLongLabels[c]}</span>
                  </span>
                </th>
                <td className="px-2">
                  <span className="block h-2 overflow-hidden rounded-sm bg-sunken" aria-hidden>
                    <span className={cn("block h-full", classColourClasses[c])} style={{ width: `${Math.max(0, p[c]) * 100}%` }} />
                  </span>
                </td>
                <td className="text-right font-mono tabular-nums">
                  <span className="whitespace-nowrap">{formatPercent(p[c])}</span>
                  {/* On a phone the error goes under the number so the four columns fit in 390 px. */}
                  {se ? <span className="block whitespace-nowrap text-xs text-faint sm:inline"> ± {formatSePoints(se[c])}</span> : null}
                </td>
                <td className="whitespace-nowrap text-right font-mono tabular-nums text-muted">{byClass ? formatPercent(byClass[c]) : "—"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : (
        <p className="text-sm text-muted">Class probabilities not computed{derived.classProbabilitiesError ? `: ${derived.classProbabilitiesError}` : "."}</p>
      )}
      {p && se ? (
        <p className="text-xs text-faint">
          From {derived.classSampleCount ?? "?"} Monte Carlo samples of the trigger&apos;s masses; ± is the binomial standard error √(p(1 − p)/N) in percentage points.
        </p>
      ) : null}
      <div className="text-sm" data-testid="p-astro">
        {astro ? (
          <p>
            <span className="text-muted">Astrophysical origin (p-astro): </span>
            <span className="font-mono tabular-nums">{formatPercent(astro.pAstro)}</span>
            <span className="text-muted"> · terrestrial </span>
            <span className="font-mono tabular-nums">{formatPercent(astro.pTerrestrial)}</span>
            <span className="block text-xs text-faint">
              Two-component Poisson mixture from network SNR {astro.networkSnr.toFixed(1)} and the false-alarm rate; {astro.ratePerYear} astrophysical
              triggers per year expected above SNR {astro.snrThreshold} (physics settings).
            </span>
          </p>
        ) : (
          <p className="text-muted">p-astro not computed{derived.astroProbabilityError ? `: ${derived.astroProbabilityError}` : "."}</p>
        )}
      </div>
    </div>
  );
}
