"use client";

import { useQuery } from "@tanstack/react-query";
import { Moon } from "lucide-react";
import Link from "next/link";
import { formatShare } from "@/components/skymap/format";
import { skymapKeys } from "@/components/skymap/query-keys";
import { TimeRange } from "@/components/skymap/time-range";
import { EmptyState } from "@/components/ui/empty-state";
import { apiFetch } from "@/lib/api-client";
import type { TonightCandidate, TonightSite } from "@/lib/data/visibility";

/** Each site's coming astronomical night, and the share of recent candidates' 90 % regions it can observe. */
export function TonightPanel({ timeZone }: { timeZone: string }) {
  const query = useQuery({
    queryKey: skymapKeys.tonight,
    refetchInterval: 5 * 60_000,
    queryFn: () => apiFetch<{ sites: TonightSite[]; candidates: TonightCandidate[] }>("/api/v1/sites/tonight?days=3&limit=12"),
  });
  const sites = query.data?.sites ?? [];
  const candidates = query.data?.candidates ?? [];
  return (
    <section className="space-y-3" aria-labelledby="tonight-title">
      <h2 id="tonight-title" className="text-sm font-semibold uppercase tracking-wide text-muted">
        Tonight
      </h2>
      {query.isLoading ? <p className="text-sm text-muted">Working out each site&apos;s night…</p> : null}
      {query.isError ? <p className="text-sm text-alarm">Could not work out tonight: {String(query.error)}</p> : null}
      {query.isSuccess ? (
        <div className="relative overflow-x-auto rounded-lg border border-line bg-surface">
          <table className="w-full text-sm" data-testid="tonight-table">
            <thead className="border-b border-line text-left text-xs text-muted">
              <tr>
                <th className="px-3 py-2 font-medium uppercase tracking-wide">Candidate</th>
                {sites.map((s) => (
                  <th key={s.site.id} className="px-3 py-2 align-bottom font-normal">
                    <span className="block font-mono text-sm font-medium text-fg">{s.site.code}</span>
                    {s.nightStart && s.nightEnd ? (
                      <TimeRange start={s.nightStart} end={s.nightEnd} timeZone={timeZone} />
                    ) : (
                      <span>no astronomical night within 24 h</span>
                    )}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {candidates.map((c) => (
                <tr key={c.id} className="border-b border-line last:border-0">
                  <td className="px-3 py-2">
                    <Link href={`/candidates/${c.id}`} className="font-mono text-accent hover:underline">
                      {c.externalId}
                    </Link>
                    <span className="block text-xs text-faint">90&nbsp;% region {Math.round(c.area90Deg2).toLocaleString("en-US")}&nbsp;deg²</span>
                  </td>
                  {sites.map((s) => {
                    const cell = c.cells[s.site.id];
                    const share = cell?.observableProbability ?? 0;
                    return (
                      <td key={s.site.id} className="px-3 py-2 text-xs">
                        <span className={`font-mono text-sm ${share >= 0.5 ? "text-ok" : share > 0 ? "text-warn" : "text-faint"}`}>{formatShare(share)}</span>
                        {cell?.bestWindow ? (
                          <span className="block text-muted">
                            <TimeRange start={cell.bestWindow.start} end={cell.bestWindow.end} timeZone={timeZone} />
                          </span>
                        ) : null}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
          {candidates.length === 0 ? (
            <div className="p-3">
              <EmptyState icon={Moon} title="No recent candidates with sky maps">
                Candidates from the last three days appear here once a sky map is attached, with the share of each 90&nbsp;% region every site can observe.
              </EmptyState>
            </div>
          ) : (
            <p className="border-t border-line px-3 py-2 text-xs text-faint">
              Share of each candidate&apos;s 90&nbsp;% region that rises above the site&apos;s altitude limit during its coming astronomical night, and the best window.
            </p>
          )}
        </div>
      ) : null}
    </section>
  );
}
