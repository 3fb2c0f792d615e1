"use client";

import {
  createColumnHelper,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { DataTable } from "@/components/ui/data-table";
import { formatDurationMs } from "@/lib/review/format";
import type { StepFigures } from "@/lib/review/summary";

/** One row of the per-shift or per-person table: a name and the selected step's figures. */
export interface GroupRowView {
  id: string;
  label: React.ReactNode;
  sortLabel: string;
  detail?: React.ReactNode;
  candidates: number;
  figures: StepFigures;
}

const column = createColumnHelper<GroupRowView>();
const ms = (v: number | null) => <span className="font-mono">{formatDurationMs(v)}</span>;
// Empty figures sort last whichever way the column is sorted.
const nullsLast = { sortUndefined: "last" as const };

/** Sortable table (TanStack Table v8) of the selected step's figures per shift or per person. */
export function GroupTable({
  rows,
  firstHeader,
  caption,
  initialSort = [],
}: {
  rows: GroupRowView[];
  firstHeader: string;
  caption: string;
  initialSort?: SortingState;
}) {
  const [sorting, setSorting] = useState<SortingState>(initialSort);
  const columns = useMemo(
    () => [
      column.accessor("sortLabel", {
        header: firstHeader,
        cell: (c) => (
          <span>
            {c.row.original.label}
            {c.row.original.detail ? <span className="block text-xs text-muted">{c.row.original.detail}</span> : null}
          </span>
        ),
      }),
      column.accessor("candidates", { header: "Candidates", cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
      column.accessor((r) => r.figures.count, { id: "count", header: "Done", cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
      column.accessor((r) => r.figures.medianMs ?? undefined, { id: "median", header: "Median", cell: (c) => ms(c.row.original.figures.medianMs), ...nullsLast }),
      column.accessor((r) => r.figures.p90Ms ?? undefined, { id: "p90", header: "p90", cell: (c) => ms(c.row.original.figures.p90Ms), ...nullsLast }),
      column.accessor((r) => r.figures.maxMs ?? undefined, { id: "max", header: "Max", cell: (c) => ms(c.row.original.figures.maxMs), ...nullsLast }),
      column.accessor((r) => r.figures.overDeadline, {
        id: "late",
        header: "Late",
        cell: (c) => <span className={c.getValue() > 0 ? "font-mono text-alarm" : "font-mono text-faint"}>{c.getValue()}</span>,
      }),
      column.accessor((r) => r.figures.open, { id: "open", header: "Open", cell: (c) => <span className="font-mono">{c.getValue()}</span> }),
    ],
    [firstHeader],
  );
  const table = useReactTable({
    data: rows,
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });
  return (
    <div className="max-h-[28rem] overflow-auto rounded-lg border border-line bg-surface">
      <DataTable table={table} caption={caption} stickyHeader rowClassName="hover:bg-raised" cellClassName="whitespace-nowrap align-top" />
      {rows.length === 0 ? <p className="p-4 text-sm text-muted">Nothing in this range.</p> : null}
    </div>
  );
}
