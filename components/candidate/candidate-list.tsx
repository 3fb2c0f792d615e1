"use client";

import { useQuery } from "@tanstack/react-query";
import { flexRender, getCoreRowModel, useReactTable, type ColumnDef, type SortingState } from "@tanstack/react-table";
import { ArrowDown, ArrowUp, ArrowUpDown, ChevronLeft, ChevronRight } from "lucide-react";
import Link from "next/link";
import { usePathname, useRouter } from "next/navigation";
import { useCallback, useMemo, useState } from "react";
import { queryKeys } from "@/components/live/query-keys";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { sourceClasses, stages, triageStates } from "@/db/schema/candidate-values";
import { apiFetch } from "@/lib/api-client";
import type { CandidateListPage, CandidateListRow } from "@/lib/data/candidates";
import { classLabels } from "@/lib/format/classes";
import { formatFalseAlarmRate } from "@/lib/format/far";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { trimmedPrecision } from "@/lib/format/uncertainty";
import { triageLabels } from "@/lib/triage/transitions";
import { candidateSortKeys, type CandidateListQuery, type CandidateSortKey } from "@/lib/validations/candidates";
import { ChipFilter, SearchBox } from "./list-filters";
import { StageBadge, stageLabels } from "./stage-badge";

/** The query as URL parameters, defaults left out, so the URL is the saved filter. */
export function listQueryString(q: CandidateListQuery): string {
  const p = new URLSearchParams();
  if (q.sort !== "receivedAt") p.set("sort", q.sort);
  if (q.dir !== "desc") p.set("dir", q.dir);
  if (q.page !== 1) p.set("page", String(q.page));
  if (q.pageSize !== 25) p.set("pageSize", String(q.pageSize));
  if (q.state.length) p.set("state", q.state.join(","));
  if (q.stage.length) p.set("stage", q.stage.join(","));
  if (q.class.length) p.set("class", q.class.join(","));
  if (q.q) p.set("q", q.q);
  return p.toString();
}

const sortable = new Set<string>(candidateSortKeys);

export function CandidateList({ initialPage, initialQuery, timeZone }: { initialPage: CandidateListPage; initialQuery: CandidateListQuery; timeZone: string }) {
  const router = useRouter();
  const pathname = usePathname();
  const [query, setQuery] = useState(initialQuery);
  const qs = listQueryString(query);
  const [firstQs] = useState(() => listQueryString(initialQuery));
  const { data, isFetching } = useQuery({
    queryKey: [...queryKeys.candidates, qs],
    queryFn: () => apiFetch<CandidateListPage>(`/api/v1/candidates?${qs}`),
    initialData: qs === firstQs ? initialPage : undefined,
    placeholderData: (previous) => previous,
  });
  const update = useCallback(
    (patch: Partial<CandidateListQuery>) => {
      const next = { ...query, page: 1, ...patch };
      setQuery(next);
      const s = listQueryString(next);
      router.replace(s ? `${pathname}?${s}` : pathname, { scroll: false });
    },
    [pathname, query, router],
  );

  const columns = useMemo<ColumnDef<CandidateListRow>[]>(
    () => [
      {
        id: "externalId",
        header: "Candidate",
        cell: ({ row }) => (
          <Link href={`/candidates/${row.original.id}`} className="font-mono font-medium text-accent hover:underline">
            {row.original.externalId}
          </Link>
        ),
      },
      { id: "stage", header: "Stage", enableSorting: false, cell: ({ row }) => <StageBadge stage={row.original.stage} /> },
      { id: "triageState", header: "Triage", cell: ({ row }) => triageLabels[row.original.triageState] },
      {
        id: "receivedAt",
        header: "Received",
        cell: ({ row }) => (
          <time dateTime={isoUtc(row.original.receivedAt)} title={isoUtc(row.original.receivedAt)} className="whitespace-nowrap tabular-nums">
            {formatInZone(row.original.receivedAt, timeZone)}
          </time>
        ),
      },
      { id: "falseAlarmRatePerYear", header: "False alarms", cell: ({ row }) => formatFalseAlarmRate(row.original.falseAlarmRatePerYear) },
      { id: "networkSnr", header: "SNR", cell: ({ row }) => <span className="tabular-nums">{row.original.networkSnr.toFixed(1)}</span> },
      {
        id: "chirpMassDetectorFrame",
        header: "𝓜 det. (M☉)",
        cell: ({ row }) => <span className="font-mono tabular-nums">{row.original.chirpMassDetectorFrame === null ? "—" : trimmedPrecision(row.original.chirpMassDetectorFrame, 4)}</span>,
      },
      { id: "class", header: "Top class", enableSorting: false, cell: ({ row }) => (row.original.dominantClass ? classLabels[row.original.dominantClass] : "—") },
      { id: "detectors", header: "Detectors", enableSorting: false, cell: ({ row }) => <span className="font-mono">{row.original.detectors.join(" ")}</span> },
      {
        id: "owner",
        header: "Owner",
        enableSorting: false,
        cell: ({ row }) => (row.original.owner ? <Avatar name={row.original.owner.name} initials={row.original.owner.initials} /> : <span className="text-faint">—</span>),
      },
    ],
    [timeZone],
  );

  const sorting: SortingState = [{ id: query.sort, desc: query.dir === "desc" }];
  const page = data ?? initialPage;
  const pageCount = Math.max(1, Math.ceil(page.total / query.pageSize));
  // The server clamps a page past the last one (the list shrank, an old bookmark): show and step from its answer.
  const pageNumber = Math.min(page.page, pageCount);
  const table = useReactTable({
    data: page.rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    pageCount,
    state: { sorting, pagination: { pageIndex: pageNumber - 1, pageSize: query.pageSize } },
    onSortingChange: (updater) => {
      const next = typeof updater === "function" ? updater(sorting) : updater;
      const first = next[0];
      if (first && sortable.has(first.id)) update({ sort: first.id as CandidateSortKey, dir: first.desc ? "desc" : "asc" });
      else update({ sort: "receivedAt", dir: "desc" });
    },
    enableSortingRemoval: false,
  });

  return (
    <div className="space-y-3" data-testid="candidate-list">
      <div className="flex flex-wrap items-center gap-3">
        <SearchBox value={query.q ?? ""} onChange={(q) => update({ q: q || undefined })} />
        <ChipFilter label="Triage" options={triageStates} labels={triageLabels} value={query.state} onChange={(state) => update({ state })} />
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <ChipFilter label="Stage" options={stages} labels={stageLabels} value={query.stage} onChange={(stage) => update({ stage })} />
        <ChipFilter label="Class" options={sourceClasses} labels={classLabels} value={query.class} onChange={(cls) => update({ class: cls })} />
      </div>
      <div className="relative overflow-x-auto rounded-lg border border-line">
        <table className="w-full text-sm" aria-busy={isFetching}>
          <thead className="bg-surface text-left text-xs text-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const canSort = sortable.has(header.column.id) && header.column.getCanSort();
                  const dir = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" className="px-3 py-2 font-medium" aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : undefined}>
                      {canSort ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 hover:text-fg">
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          {dir === "asc" ? <ArrowUp aria-hidden className="h-3 w-3" /> : dir === "desc" ? <ArrowDown aria-hidden className="h-3 w-3" /> : <ArrowUpDown aria-hidden className="h-3 w-3 opacity-50" />}
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => (
              <tr key={row.id} className="border-t border-line hover:bg-raised/60">
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className="px-3 py-2">
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {page.rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-10 text-center text-muted">
                  {page.total === 0 && qs === "" ? "No candidates yet. Triggers from the detector feed are listed here." : "No candidate matches these filters."}
                </td>
              </tr>
            ) : null}
          </tbody>
        </table>
      </div>
      <nav aria-label="Pages" className="flex flex-wrap items-center justify-between gap-3 text-sm">
        <p className="text-muted">
          {page.total} candidate{page.total === 1 ? "" : "s"} · page {pageNumber} of {pageCount}
        </p>
        <div className="flex items-center gap-2">
          <label className="flex items-center gap-2 text-xs text-muted">
            Per page
            <Select className="w-20 py-1" value={query.pageSize} onChange={(e) => update({ pageSize: Number(e.target.value) })}>
              {[25, 50, 100].map((n) => (
                <option key={n}>{n}</option>
              ))}
            </Select>
          </label>
          <Button size="sm" onClick={() => update({ page: pageNumber - 1 })} disabled={pageNumber <= 1} aria-label="Previous page">
            <ChevronLeft aria-hidden className="h-4 w-4" />
          </Button>
          <Button size="sm" onClick={() => update({ page: pageNumber + 1 })} disabled={pageNumber >= pageCount} aria-label="Next page">
            <ChevronRight aria-hidden className="h-4 w-4" />
          </Button>
        </div>
      </nav>
    </div>
  );
}
