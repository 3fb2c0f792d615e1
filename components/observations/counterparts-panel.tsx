"use client";

import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { TriangleAlert } from "lucide-react";
import { useMemo, useState } from "react";
import { formatArea, formatDec, formatRa } from "@/components/skymap/format";
import { DataTable } from "@/components/ui/data-table";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { errorText } from "@/lib/api-client";
import { formatInZone, isoUtc } from "@/lib/format/time";
import type { CounterpartAnswer } from "@/lib/services/report-counterpart";
import { CounterpartForm } from "./counterpart-form";
import { useCounterparts } from "./use-observations";

const column = createColumnHelper<CounterpartAnswer>();
// nulls sort last whichever way the column is sorted
const nullsLast = { sortUndefined: "last" as const, invertSorting: false };

/** Transients reported for this candidate, ranked on the newest sky map (sortable), and the form to report one. */
export function CounterpartsPanel({ candidateId, canReport, timeZone }: { candidateId: string; canReport: boolean; timeZone: string }) {
  const list = useCounterparts(candidateId);
  const [sorting, setSorting] = useState<SortingState>([{ id: "searchedProbability", desc: false }]);
  const columns = useMemo(
    () => [
      column.accessor((c) => c.name ?? "", { id: "name", header: "Name", cell: (c) => c.getValue() || <span className="text-faint">unnamed</span> }),
      column.accessor((c) => Date.parse(c.observedAt), {
        id: "observedAt",
        header: "Seen",
        cell: (c) => (
          <time dateTime={c.row.original.observedAt} title={`${isoUtc(c.row.original.observedAt)} (UTC)`}>
            {formatInZone(c.row.original.observedAt, timeZone)}
          </time>
        ),
      }),
      column.accessor("raDeg", { header: "Position", enableSorting: false, cell: (c) => <span className="font-mono text-xs">{formatRa(c.getValue())} {formatDec(c.row.original.decDeg)}</span> }),
      column.accessor((c) => c.magnitude ?? undefined, {
        id: "magnitude",
        header: "Mag",
        ...nullsLast,
        cell: (c) => {
          const m = c.row.original;
          if (m.magnitude === null) return "—";
          return `${m.magnitude.toFixed(2)}${m.magnitudeError !== null ? ` ± ${m.magnitudeError.toFixed(2)}` : ""}${m.filter ? ` ${m.filter}` : ""}`;
        },
      }),
      column.accessor((c) => c.searchedProbability ?? undefined, {
        id: "searchedProbability",
        header: "Searched prob.",
        ...nullsLast,
        cell: (c) => {
          const m = c.row.original;
          if (m.searchedProbability === null) return "—";
          return (
            <span className="inline-flex items-center gap-1 font-mono">
              {(m.searchedProbability * 100).toFixed(1)} %
              {m.warning ? <TriangleAlert aria-label={m.warning} className="h-3.5 w-3.5 text-warn" /> : null}
            </span>
          );
        },
      }),
      column.accessor((c) => c.searchedAreaDeg2 ?? undefined, {
        id: "searchedAreaDeg2",
        header: "Searched area",
        ...nullsLast,
        cell: (c) => (c.row.original.searchedAreaDeg2 === null ? "—" : formatArea(c.row.original.searchedAreaDeg2)),
      }),
      column.accessor("notes", { header: "Notes", enableSorting: false, cell: (c) => <span className="line-clamp-2 max-w-xs">{c.getValue()}</span> }),
    ],
    [timeZone],
  );
  const rows = useMemo(() => list.data?.counterparts ?? [], [list.data]);
  const table = useReactTable({ data: rows, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel(), getRowId: (r) => r.id });
  const outside = rows.filter((r) => r.warning && r.searchedProbability !== null).length;
  return (
    <Panel aria-labelledby="counterparts-title" data-testid="counterparts-panel">
      <PanelTitle id="counterparts-title">Counterparts</PanelTitle>
      {list.isError ? <p className="text-sm text-alarm">Could not load counterparts: {errorText(list.error)}</p> : null}
      {list.isSuccess && rows.length === 0 ? <p className="text-sm text-muted">None reported yet.</p> : null}
      {rows.length ? (
        <div className="relative overflow-x-auto">
          <DataTable table={table} caption="Counterparts, sortable" testId="counterparts-table" />
        </div>
      ) : null}
      {outside ? <p className="mt-2 text-xs text-warn">{outside === 1 ? "One lies" : `${outside} lie`} outside the 99.9 % credible region of the newest map.</p> : null}
      <p className="mt-2 text-xs text-faint">
        Searched probability: the probability of every pixel at least as dense as the one holding the position (the smallest credible region that
        contains it), on the newest sky map; a rapid estimate, not a parameter estimate.
      </p>
      {canReport ? <CounterpartForm candidateId={candidateId} /> : null}
    </Panel>
  );
}
