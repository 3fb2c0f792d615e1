"use client";

import { useQuery } from "@tanstack/react-query";
import { ArrowDown, ArrowUp } from "lucide-react";
import { useMemo, useState } from "react";
import { Input, Select } from "@/components/ui/field";
import { ApiClientError, apiFetch, errorText } from "@/lib/api-client";
import type { GalaxyTargets } from "@/lib/services/rank-galaxies";
import { formatDec, formatRa, formatShare } from "./format";
import { TimeRange } from "./time-range";

export type GalaxyRow = GalaxyTargets["galaxies"][number];

/** The ranked galaxies of the default catalogue for a candidate's newest map (100 best; a site adds tonight's windows). */
export function useGalaxyTargets(candidateId: string, siteId: string, enabled: boolean) {
  return useQuery({
    queryKey: ["galaxies", candidateId, siteId] as const,
    enabled,
    retry: (count, error) => !(error instanceof ApiClientError && (error.status === 404 || error.status === 409)) && count < 2,
    queryFn: () => apiFetch<GalaxyTargets>(`/api/v1/candidates/${candidateId}/galaxies?limit=100${siteId ? `&siteId=${encodeURIComponent(siteId)}` : ""}`),
  });
}

type SortKey = "rank" | "name" | "raDeg" | "decDeg" | "distanceMpc" | "weight" | "normalizedScore" | "window";
const columns: ReadonlyArray<{ key: SortKey; label: string; numeric?: boolean; title?: string }> = [
  { key: "rank", label: "#", numeric: true },
  { key: "name", label: "Galaxy" },
  { key: "raDeg", label: "RA", numeric: true },
  { key: "decDeg", label: "Dec", numeric: true },
  { key: "distanceMpc", label: "Distance", numeric: true },
  { key: "weight", label: "Weight", numeric: true, title: "The catalogue's luminosity or mass proxy (relative)" },
  { key: "normalizedScore", label: "Share", numeric: true, title: "This galaxy's score over the sum for every catalogue galaxy in the credible region" },
  { key: "window", label: "Best window" },
];

/** A sortable, searchable table of ranked host-galaxy candidates; marks on the zoomed map use the same data. */
export function GalaxyTargetsTable({
  query,
  sites,
  siteId,
  onSiteChange,
  timeZone,
}: {
  query: ReturnType<typeof useGalaxyTargets>;
  sites: ReadonlyArray<{ id: string; code: string; name: string }>;
  siteId: string;
  onSiteChange: (id: string) => void;
  timeZone: string;
}) {
  const [search, setSearch] = useState("");
  const [sort, setSort] = useState<{ key: SortKey; descending: boolean }>({ key: "rank", descending: false });
  const ranked = useMemo(() => (query.data?.galaxies ?? []).map((g, i) => ({ ...g, rank: i + 1 })), [query.data]);
  const shown = useMemo(() => {
    const needle = search.trim().toLowerCase();
    const rows = needle ? ranked.filter((g) => g.name.toLowerCase().includes(needle)) : ranked;
    const value = (g: (typeof rows)[number]): number | string =>
      sort.key === "window" ? (g.bestWindow ? Date.parse(g.bestWindow.start) : Number.POSITIVE_INFINITY) : sort.key === "name" ? g.name.toLowerCase() : g[sort.key];
    return [...rows].sort((a, b) => {
      const x = value(a);
      const y = value(b);
      const order = x < y ? -1 : x > y ? 1 : a.rank - b.rank;
      return sort.descending ? -order : order;
    });
  }, [ranked, search, sort]);

  if (query.isError) {
    const status = query.error instanceof ApiClientError ? query.error.status : 0;
    return (
      <p className="text-sm text-muted" data-testid="galaxies-unavailable">
        {status === 409 || status === 404 ? errorText(query.error) : `Could not rank galaxies: ${errorText(query.error)}`}
      </p>
    );
  }
  if (!query.data) return <p className="text-sm text-muted">Ranking the catalogue&apos;s galaxies…</p>;
  const clickSort = (key: SortKey) =>
    setSort((s) => (s.key === key ? { key, descending: !s.descending } : { key, descending: key === "normalizedScore" || key === "weight" }));

  return (
    <div className="space-y-2">
      <div className="flex flex-wrap items-end gap-2">
        <label className="text-xs text-muted">
          Search by name
          <Input value={search} onChange={(e) => setSearch(e.target.value)} placeholder="e.g. CDG-0123" className="mt-1 h-8 w-48 py-1 text-sm" data-testid="galaxy-search" />
        </label>
        <label className="text-xs text-muted">
          Windows for
          <Select value={siteId} onChange={(e) => onSiteChange(e.target.value)} className="mt-1 h-8 w-auto py-1 text-sm" aria-label="Site for the best windows">
            <option value="">No site</option>
            {sites.map((s) => (
              <option key={s.id} value={s.id}>
                {s.code} · {s.name}
              </option>
            ))}
          </Select>
        </label>
        <p className="ml-auto text-xs text-faint">
          {query.data.galaxies.length} best of {query.data.consideredRows.toLocaleString("en-US")} galaxies in the {Math.round(query.data.credibleLevel * 100)} % region
          {query.data.galaxies.length ? ` · together ${formatShare(query.data.galaxies.at(-1)?.cumulativeScore ?? 0)} of the summed score` : ""}
        </p>
      </div>
      <div className="relative max-h-96 overflow-auto rounded-md border border-line">
        <table className="w-full text-sm" data-testid="galaxy-table">
          <thead className="sticky top-0 border-b border-line bg-surface text-left text-xs uppercase tracking-wide text-muted">
            <tr>
              {columns.map((c) => (
                <th key={c.key} className={`px-2 py-1.5 font-medium ${c.numeric ? "text-right" : ""}`} title={c.title} aria-sort={sort.key === c.key ? (sort.descending ? "descending" : "ascending") : "none"}>
                  <button type="button" onClick={() => clickSort(c.key)} className="inline-flex items-center gap-1 uppercase hover:text-fg">
                    {c.label}
                    {sort.key === c.key ? sort.descending ? <ArrowDown aria-hidden className="h-3 w-3" /> : <ArrowUp aria-hidden className="h-3 w-3" /> : null}
                  </button>
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {shown.map((g) => (
              <tr key={`${g.rank}-${g.name}`} className="border-b border-line last:border-0">
                <td className="px-2 py-1 text-right font-mono text-faint">{g.rank}</td>
                <td className="px-2 py-1 font-mono">{g.name}</td>
                <td className="px-2 py-1 text-right font-mono" title={`${g.raDeg.toFixed(5)}°`}>{formatRa(g.raDeg)}</td>
                <td className="px-2 py-1 text-right font-mono" title={`${g.decDeg.toFixed(5)}°`}>{formatDec(g.decDeg)}</td>
                <td className="px-2 py-1 text-right font-mono">{g.distanceMpc.toFixed(0)} Mpc</td>
                <td className="px-2 py-1 text-right font-mono">{g.weight.toPrecision(3)}</td>
                <td className="px-2 py-1 text-right font-mono" title={`cumulative ${formatShare(g.cumulativeScore)}; score ${g.score.toExponential(3)} per sr per Mpc³`}>
                  {formatShare(g.normalizedScore)}
                </td>
                <td className="px-2 py-1 text-xs">
                  {g.bestWindow ? <TimeRange start={g.bestWindow.start} end={g.bestWindow.end} timeZone={timeZone} /> : <span className="text-faint">{siteId ? "not above the limit tonight" : "—"}</span>}
                </td>
              </tr>
            ))}
            {shown.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-2 py-3 text-center text-muted">
                  {ranked.length ? "No galaxy of this list matches the search." : "No catalogue galaxy lies in the credible region."}
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-faint">
        Score: probability per steradian of the galaxy&apos;s pixel × DISTNORM × N(distance; DISTMU, DISTSIGMA) × weight, the 3D localisation
        ansatz of Singer et al. 2016 times the catalogue&apos;s weight; share is the score over the sum for every catalogue galaxy in the region.
        Best window: the longest stretch of the site&apos;s coming astronomical night with the galaxy above the site&apos;s altitude limit.
      </p>
    </div>
  );
}
