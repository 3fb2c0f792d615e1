"use client";

import dynamic from "next/dynamic";
import { Caution } from "@/components/candidate/caution";
import { formatArea, formatShare } from "@/components/skymap/format";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { errorText } from "@/lib/api-client";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { useCoverage } from "./use-observations";

const CoverageChart = dynamic(() => import("./coverage-chart"), {
  ssr: false,
  loading: () => <div className="h-56 animate-pulse rounded-md bg-sunken" aria-label="Loading the chart" />,
});

export interface SiteRef {
  id: string;
  code: string;
  name: string;
}

/** How much of the newest sky map has been imaged, when, and by which site (updated live as exposures are logged). */
export function CoveragePanel({ candidateId, sites, timeZone }: { candidateId: string; sites: SiteRef[]; timeZone: string }) {
  const coverage = useCoverage(candidateId);
  const siteOf = (id: string | null) => sites.find((s) => s.id === id);
  const data = coverage.data;
  return (
    <Panel aria-labelledby="coverage-title" data-testid="coverage-panel">
      <PanelTitle id="coverage-title">Observed so far</PanelTitle>
      {coverage.isLoading ? <p className="text-sm text-muted">Working out the coverage…</p> : null}
      {coverage.isError ? <p className="text-sm text-alarm">Could not load the coverage: {errorText(coverage.error)}</p> : null}
      {coverage.isSuccess && data === null ? <p className="text-sm text-muted">Coverage appears once the candidate has a sky map.</p> : null}
      {data ? (
        <div className="space-y-3">
          <dl className="grid grid-cols-3 gap-3 text-sm">
            <Figure label="Probability observed" value={formatShare(data.coveredProbability)} hint={data.coveredProbability.toFixed(4)} testId="covered-probability" />
            <Figure label="Area observed" value={formatArea(data.coveredAreaDeg2)} />
            <Figure label="Exposures" value={data.observations.toLocaleString("en-US")} testId="exposure-count" />
          </dl>
          {data.curve.length ? (
            <CoverageChart
              points={data.curve.map((p) => ({ hours: p.secondsSinceMerger / 3600, percent: p.coveredProbability * 100 }))}
              sites={data.bySite.map((s) => ({ code: siteOf(s.siteId)?.code ?? "no site", hours: (Date.parse(s.firstObservationAt) - mergerMs(data)) / 3_600_000 }))}
            />
          ) : (
            <p className="text-sm text-muted">No exposures logged yet.</p>
          )}
          {data.bySite.length ? (
            <div className="relative overflow-x-auto">
              <table className="w-full text-sm">
                <caption className="sr-only">Coverage by site</caption>
                <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-muted">
                  <tr>
                    <th className="px-2 py-1 font-medium">Site</th>
                    <th className="px-2 py-1 font-medium">Observed</th>
                    <th className="px-2 py-1 font-medium">First exposure</th>
                  </tr>
                </thead>
                <tbody>
                  {data.bySite.map((s) => (
                    <tr key={s.siteId ?? "none"} className="border-b border-line last:border-0">
                      <td className="px-2 py-1" title={siteOf(s.siteId)?.name}>
                        {siteOf(s.siteId)?.code ?? "No site"}
                      </td>
                      <td className="px-2 py-1 font-mono">{formatShare(s.coveredProbability)}</td>
                      <td className="px-2 py-1">
                        <time dateTime={s.firstObservationAt} title={`${isoUtc(s.firstObservationAt)} (UTC)`}>
                          {formatInZone(s.firstObservationAt, timeZone)}
                        </time>
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          <p className="text-xs text-faint">
            Union of every logged footprint on the newest sky map (overlaps counted once; a pixel counts when its centre lies inside a footprint).
            Each step of the curve is an exposure&apos;s end.
          </p>
          <Caution />
        </div>
      ) : null}
    </Panel>
  );
}

/** The merger instant, recovered from any curve point (time − seconds since merger). */
function mergerMs(data: { curve: Array<{ time: string; secondsSinceMerger: number }> }): number {
  const p = data.curve[0];
  return p ? Date.parse(p.time) - p.secondsSinceMerger * 1000 : 0;
}

function Figure({ label, value, hint, testId }: { label: string; value: string; hint?: string; testId?: string }) {
  return (
    <div className="rounded-md border border-line bg-sunken px-3 py-2">
      <dt className="text-xs text-muted">{label}</dt>
      <dd className="font-mono text-base" title={hint} data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}
