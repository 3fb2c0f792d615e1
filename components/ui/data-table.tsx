"use client";

import { flexRender, type Table } from "@tanstack/react-table";
import { ArrowDown, ArrowUp, ArrowUpDown } from "lucide-react";
import { cn } from "./cn";

/**
 * The table body every TanStack table here shares: sortable headers as buttons with aria-sort and an icon that
 * says the direction, rows with a bottom rule. The caller owns the table state and the frame around it.
 */
export function DataTable<Row>({
  table,
  caption,
  stickyHeader = false,
  rowClassName,
  cellClassName = "align-middle",
  testId,
}: {
  table: Table<Row>;
  caption?: string;
  stickyHeader?: boolean;
  rowClassName?: string;
  cellClassName?: string;
  testId?: string;
}) {
  return (
    <table className="w-full text-sm" data-testid={testId}>
      {caption ? <caption className="sr-only">{caption}</caption> : null}
      <thead className={cn("border-b border-line text-left text-xs uppercase tracking-wide text-muted", stickyHeader && "sticky top-0 bg-surface")}>
        {table.getHeaderGroups().map((hg) => (
          <tr key={hg.id}>
            {hg.headers.map((h) => {
              const dir = h.column.getIsSorted();
              const Icon = dir === "asc" ? ArrowUp : dir === "desc" ? ArrowDown : ArrowUpDown;
              const label = flexRender(h.column.columnDef.header, h.getContext());
              return (
                <th key={h.id} className="px-3 py-2 font-medium" aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : undefined}>
                  {h.column.getCanSort() ? (
                    <button type="button" className="inline-flex items-center gap-1 hover:text-fg" onClick={h.column.getToggleSortingHandler()}>
                      {label}
                      <Icon className="h-3 w-3" aria-hidden />
                    </button>
                  ) : (
                    label
                  )}
                </th>
              );
            })}
          </tr>
        ))}
      </thead>
      <tbody>
        {table.getRowModel().rows.map((row) => (
          <tr key={row.id} className={cn("border-b border-line last:border-0", rowClassName)}>
            {row.getVisibleCells().map((cell) => (
              <td key={cell.id} className={cn("px-3 py-2", cellClassName)}>
                {flexRender(cell.column.columnDef.cell, cell.getContext())}
              </td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
