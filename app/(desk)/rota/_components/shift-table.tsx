"use client";

import { createColumnHelper, flexRender, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { ArrowUpDown, CircleSlash, Layers, Pencil, Trash2 } from "lucide-react";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { ZonedTime } from "@/components/paging/zoned-time";
import type { RotaIssueJson, ShiftView } from "./types";

const column = createColumnHelper<ShiftView>();

function hours(s: ShiftView): number {
  return (Date.parse(s.endsAt) - Date.parse(s.startsAt)) / 3_600_000;
}

/** The week's shifts as a sortable table; coordinators edit and remove from here. */
export function ShiftTable({
  shifts,
  issues,
  timeZone,
  onEdit,
  onDelete,
}: {
  shifts: ShiftView[];
  issues: RotaIssueJson[];
  timeZone: string;
  onEdit?: (s: ShiftView) => void;
  onDelete?: (s: ShiftView) => void;
}) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "startsAt", desc: false }]);
  const overlapping = useMemo(() => new Set(issues.flatMap((i) => (i.kind === "overlap" ? i.shiftIds : []))), [issues]);
  const gapAfter = useMemo(() => new Set(issues.filter((i) => i.kind === "gap").map((g) => g.from)), [issues]);
  const columns = useMemo(
    () => [
      column.accessor("startsAt", { header: "Starts", cell: (c) => <ZonedTime at={c.getValue()} timeZone={timeZone} /> }),
      column.accessor("endsAt", { header: "Ends", cell: (c) => <ZonedTime at={c.getValue()} timeZone={timeZone} /> }),
      column.display({ id: "hours", header: "Hours", cell: (c) => hours(c.row.original).toFixed(hours(c.row.original) % 1 ? 1 : 0) }),
      column.accessor((s) => s.primary.name, { id: "primary", header: "Primary" }),
      column.accessor((s) => s.backup?.name ?? "", { id: "backup", header: "Backup", cell: (c) => c.getValue() || <span className="text-warn">none</span> }),
      column.display({
        id: "flags",
        header: "Flags",
        cell: (c) => (
          <span className="flex flex-col gap-0.5 text-xs">
            {overlapping.has(c.row.original.id) ? (
              <span className="inline-flex items-center gap-1 text-warn">
                <Layers aria-hidden className="h-3.5 w-3.5" /> overlaps
              </span>
            ) : null}
            {gapAfter.has(new Date(c.row.original.endsAt).toISOString()) ? (
              <span className="inline-flex items-center gap-1 text-alarm">
                <CircleSlash aria-hidden className="h-3.5 w-3.5" /> gap after
              </span>
            ) : null}
          </span>
        ),
      }),
      column.accessor("notes", { header: "Notes", cell: (c) => <span className="text-muted">{c.getValue()}</span> }),
      ...(onEdit || onDelete
        ? [
            column.display({
              id: "actions",
              header: () => <span className="sr-only">Actions</span>,
              cell: (c) => (
                <span className="flex justify-end gap-1">
                  {onEdit ? (
                    <Button size="sm" variant="ghost" aria-label={`Edit shift of ${c.row.original.primary.name}`} onClick={() => onEdit(c.row.original)}>
                      <Pencil aria-hidden className="h-4 w-4" />
                    </Button>
                  ) : null}
                  {onDelete ? (
                    <Button size="sm" variant="ghost" aria-label={`Remove shift of ${c.row.original.primary.name}`} onClick={() => onDelete(c.row.original)}>
                      <Trash2 aria-hidden className="h-4 w-4" />
                    </Button>
                  ) : null}
                </span>
              ),
            }),
          ]
        : []),
    ],
    [timeZone, overlapping, gapAfter, onEdit, onDelete],
  );
  const table = useReactTable({ data: shifts, columns, state: { sorting }, onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-sm" data-testid="rota-table">
        <thead className="text-left text-xs uppercase tracking-wide text-muted">
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <th key={header.id} className="py-2 pr-3 font-medium" aria-sort={header.column.getIsSorted() === "asc" ? "ascending" : header.column.getIsSorted() === "desc" ? "descending" : undefined}>
                  {header.column.getCanSort() ? (
                    <button type="button" className="inline-flex items-center gap-1 uppercase" onClick={header.column.getToggleSortingHandler()}>
                      {flexRender(header.column.columnDef.header, header.getContext())}
                      <ArrowUpDown aria-hidden className="h-3 w-3" />
                    </button>
                  ) : (
                    flexRender(header.column.columnDef.header, header.getContext())
                  )}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody className="divide-y divide-line">
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id}>
              {row.getVisibleCells().map((cell) => (
                <td key={cell.id} className="py-2 pr-3 align-top">
                  {flexRender(cell.column.columnDef.cell, cell.getContext())}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
