"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable } from "@tanstack/react-table";
import { Pencil, Plus, Telescope, Trash2 } from "lucide-react";
import { useMemo, useState } from "react";
import { toast } from "sonner";
import { skymapKeys } from "@/components/skymap/query-keys";
import { Button } from "@/components/ui/button";
import { DataTable } from "@/components/ui/data-table";
import { Dialog } from "@/components/ui/dialog";
import { apiFetch, errorText } from "@/lib/api-client";
import type { SiteRecord } from "@/lib/data/sites";
import type { InstrumentRecord } from "@/lib/instruments/service";
import type { InstrumentFormOutput } from "@/lib/validations/instruments";
import { InstrumentForm } from "./instrument-form";

const column = createColumnHelper<InstrumentRecord>();

/** "2° × 1.5°" for a rectangle, "⌀ 2°" for a circle; numbers and units never split across lines. */
export function describeFootprint(f: InstrumentRecord["footprint"]): string {
  return f.shape === "rectangle" ? `${f.widthDeg}°\u00a0×\u00a0${f.heightDeg}°` : `⌀\u00a0${2 * f.radiusDeg}°\u00a0circle`;
}

function RowActions({ label, onEdit, onDelete }: { label: string; onEdit: () => void; onDelete: () => void }) {
  return (
    <span className="flex shrink-0 gap-1">
      <Button size="sm" variant="ghost" aria-label={`Edit ${label}`} onClick={onEdit}>
        <Pencil aria-hidden className="h-3.5 w-3.5" />
      </Button>
      <Button size="sm" variant="ghost" aria-label={`Delete ${label}`} onClick={onDelete}>
        <Trash2 aria-hidden className="h-3.5 w-3.5" />
      </Button>
    </span>
  );
}

const limiting = (mag: number | null) => (mag === null ? "no limiting mag" : `limiting mag ${mag}`);

/** One site's instruments: a table for everyone, add/edit/delete for coordinators. */
function SiteInstruments({ site, canManage }: { site: SiteRecord; canManage: boolean }) {
  const queryClient = useQueryClient();
  const [editing, setEditing] = useState<InstrumentRecord | "new" | null>(null);
  const [deleting, setDeleting] = useState<InstrumentRecord | null>(null);
  const key = skymapKeys.instruments(site.id);
  const query = useQuery({ queryKey: key, queryFn: () => apiFetch<{ instruments: InstrumentRecord[] }>(`/api/v1/sites/${site.id}/instruments`) });
  const changed = (message: string) => {
    toast.success(message);
    setEditing(null);
    setDeleting(null);
    // Suggestions and tonight's figures read the instruments too.
    void queryClient.invalidateQueries({ queryKey: skymapKeys.sites });
    void queryClient.invalidateQueries({ queryKey: skymapKeys.tonight });
  };
  const save = useMutation({
    mutationFn: ({ id, values }: { id?: string; values: InstrumentFormOutput }) =>
      apiFetch<{ instrument: InstrumentRecord }>(id ? `/api/v1/instruments/${id}` : `/api/v1/sites/${site.id}/instruments`, { method: id ? "PATCH" : "POST", json: values }),
    onSuccess: (r, v) => changed(`${site.code} · ${r.instrument.name} ${v.id ? "saved" : "added"}`),
    onError: (e) => toast.error(errorText(e)),
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/instruments/${id}`, { method: "DELETE" }),
    onSuccess: () => changed("Instrument deleted"),
    onError: (e) => toast.error(errorText(e)),
  });
  const columns = useMemo(
    () => [
      column.accessor("name", { header: "Instrument", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      column.accessor("footprint", { header: "Footprint", enableSorting: false, cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{describeFootprint(c.getValue())}</span> }),
      column.accessor("areaDeg2", { header: "Area", cell: (c) => <span className="whitespace-nowrap font-mono text-xs">{c.getValue().toLocaleString("en-US", { maximumFractionDigits: 3 })}&nbsp;deg²</span> }),
      column.accessor("filters", { header: "Filters", enableSorting: false, cell: (c) => (c.getValue().length ? <span className="whitespace-nowrap font-mono text-xs">{c.getValue().join(" ")}</span> : <span className="text-xs text-faint">none</span>) }),
      column.accessor("exposureS", { header: "Exposure", cell: (c) => <span className="whitespace-nowrap">{c.getValue()}&nbsp;s</span> }),
      column.accessor("overheadS", { header: "Overhead", cell: (c) => <span className="whitespace-nowrap">{c.getValue()}&nbsp;s</span> }),
      column.accessor("limitingMag", { header: "Limiting mag", cell: (c) => (c.getValue() === null ? <span className="text-xs text-faint">—</span> : c.getValue()) }),
      ...(canManage
        ? [
            column.display({
              id: "actions",
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row: { original: i } }) => <RowActions label={`${site.code} ${i.name}`} onEdit={() => setEditing(i)} onDelete={() => setDeleting(i)} />,
            }),
          ]
        : []),
    ],
    [canManage, site.code],
  );
  const instruments = query.data?.instruments ?? [];
  const table = useReactTable({ data: instruments, columns, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  return (
    <div className="space-y-2" data-testid={`instruments-${site.code}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm">
          <span className="font-mono font-medium">{site.code}</span> <span className="text-muted">{site.name}</span>
        </h3>
        {canManage ? (
          <Button size="sm" onClick={() => setEditing("new")} aria-label={`Add an instrument to ${site.code}`}>
            <Plus aria-hidden className="h-3.5 w-3.5" /> Add instrument
          </Button>
        ) : null}
      </div>
      {query.isSuccess && instruments.length === 0 ? (
        // One line, not the tall empty state: several sites may have none yet.
        <p className="flex items-center gap-2 rounded-lg border border-dashed border-line bg-sunken px-3 py-3 text-sm text-muted">
          <Telescope aria-hidden className="h-4 w-4 shrink-0 text-faint" />
          {canManage ? `No instruments at ${site.code} yet: add the camera or spectrograph it points, with its footprint, filters, exposure and overhead.` : `No instruments at ${site.code} yet; plans need one, and coordinators add them.`}
        </p>
      ) : (
        <div className="relative overflow-x-auto rounded-lg border border-line bg-surface">
          {/* A phone reads one card per instrument; a wider screen the table. */}
          <div className="hidden sm:block">
            <DataTable table={table} caption={`Instruments at ${site.code}`} testId={`instruments-table-${site.code}`} />
          </div>
          <ul className="divide-y divide-line sm:hidden" data-testid={`instruments-list-${site.code}`} aria-label={`Instruments at ${site.code}`}>
            {instruments.map((i) => (
              <li key={i.id} className="space-y-1 px-3 py-2 text-sm">
                <div className="flex items-start justify-between gap-2">
                  <span className="font-medium">{i.name}</span>
                  {canManage ? <RowActions label={`${site.code} ${i.name}`} onEdit={() => setEditing(i)} onDelete={() => setDeleting(i)} /> : null}
                </div>
                <p className="font-mono text-xs text-muted">
                  <span className="whitespace-nowrap">{describeFootprint(i.footprint)}</span> · <span className="whitespace-nowrap">{i.areaDeg2.toLocaleString("en-US", { maximumFractionDigits: 3 })}&nbsp;deg²</span>
                  {i.filters.length ? <> · <span className="whitespace-nowrap">{i.filters.join(" ")}</span></> : null}
                </p>
                <p className="text-xs text-muted">
                  <span className="whitespace-nowrap">{i.exposureS}&nbsp;s exposure</span> · <span className="whitespace-nowrap">{i.overheadS}&nbsp;s overhead</span> · <span className="whitespace-nowrap">{limiting(i.limitingMag)}</span>
                </p>
              </li>
            ))}
          </ul>
          {query.isLoading ? <p className="p-3 text-sm text-muted">Loading instruments…</p> : null}
          {query.isError ? <p className="p-3 text-sm text-alarm">Could not load the instruments: {errorText(query.error)}</p> : null}
        </div>
      )}
      <Dialog
        open={editing !== null}
        onOpenChange={(open) => !open && setEditing(null)}
        title={editing === "new" ? `Add an instrument to ${site.code}` : `Edit ${site.code} · ${editing?.name ?? ""}`}
        description="Footprint on the sky (a north-up rectangle or a circle), filters, default exposure and the overhead of each pointing."
      >
        {editing !== null ? (
          <InstrumentForm
            key={editing === "new" ? "new" : editing.id}
            instrument={editing === "new" ? undefined : editing}
            pending={save.isPending}
            onSubmit={(values) => save.mutate({ id: editing === "new" ? undefined : editing.id, values })}
          />
        ) : null}
      </Dialog>
      <Dialog
        open={deleting !== null}
        onOpenChange={(open) => !open && setDeleting(null)}
        title={`Delete ${site.code} · ${deleting?.name ?? ""}?`}
        description="New plans can no longer choose it; the audit log keeps the change."
      >
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={() => setDeleting(null)}>
            Keep it
          </Button>
          <Button variant="danger" disabled={remove.isPending} onClick={() => deleting && remove.mutate(deleting.id)}>
            Delete the instrument
          </Button>
        </div>
      </Dialog>
    </div>
  );
}

/** Every site's instruments, one table per site. */
export function InstrumentsPanel({ sites, canManage }: { sites: SiteRecord[]; canManage: boolean }) {
  return (
    <section className="space-y-4" aria-labelledby="instruments-title">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="instruments-title" className="text-sm font-semibold uppercase tracking-wide text-muted">
          Instruments
        </h2>
        {canManage ? null : <span className="text-xs text-faint">Coordinators add and edit instruments.</span>}
      </div>
      {sites.map((site) => (
        <SiteInstruments key={site.id} site={site} canManage={canManage} />
      ))}
    </section>
  );
}
