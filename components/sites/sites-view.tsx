"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable } from "@tanstack/react-table";
import { MapPin, Pencil, Plus, Trash2 } from "lucide-react";
import { useMemo, useState } from "react";
import { toast } from "sonner";
import { DataTable } from "@/components/ui/data-table";
import { skymapKeys } from "@/components/skymap/query-keys";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { apiFetch, errorText } from "@/lib/api-client";
import type { SiteObserver, SiteRecord } from "@/lib/data/sites";
import type { SiteInput } from "@/lib/validations/sites";
import { InstrumentsPanel } from "./instruments-panel";
import { SiteForm } from "./site-form";
import { TonightPanel } from "./tonight-panel";

const column = createColumnHelper<SiteRecord>();
const signed = (v: number, pos: string, neg: string) => `${Math.abs(v).toFixed(2)}° ${v >= 0 ? pos : neg}`;

/** The sites table (forms for coordinators, read-only for others) and tonight's visibility per site. */
export function SitesView({ canManage, timeZone }: { canManage: boolean; timeZone: string }) {
  const queryClient = useQueryClient();
  const [editing, setEditing] = useState<SiteRecord | "new" | null>(null);
  const [deleting, setDeleting] = useState<SiteRecord | null>(null);
  const query = useQuery({
    queryKey: skymapKeys.sites,
    queryFn: () => apiFetch<{ sites: SiteRecord[]; observerOptions: SiteObserver[] }>("/api/v1/sites"),
  });
  const changed = (message: string) => {
    toast.success(message);
    setEditing(null);
    setDeleting(null);
    void queryClient.invalidateQueries({ queryKey: skymapKeys.sites });
    void queryClient.invalidateQueries({ queryKey: skymapKeys.tonight });
  };
  const save = useMutation({
    mutationFn: ({ id, values }: { id?: string; values: SiteInput }) =>
      apiFetch<{ site: SiteRecord }>(id ? `/api/v1/sites/${id}` : "/api/v1/sites", { method: id ? "PUT" : "POST", json: values }),
    onSuccess: (r, v) => changed(v.id ? `${r.site.code} saved` : `${r.site.code} added`),
    onError: (e) => toast.error(errorText(e)),
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/sites/${id}`, { method: "DELETE" }),
    onSuccess: () => changed("Site deleted"),
    onError: (e) => toast.error(errorText(e)),
  });

  const columns = useMemo(
    () => [
      column.accessor("code", { header: "Code", cell: (c) => <span className="font-mono font-medium">{c.getValue()}</span> }),
      column.accessor("name", { header: "Name" }),
      column.display({
        id: "position",
        header: "Position",
        cell: ({ row: { original: s } }) => (
          // Each coordinate and the height stay whole; a narrow table breaks only between them.
          <span className="font-mono text-xs">
            <span className="whitespace-nowrap">{signed(s.latitudeDeg, "N", "S")},</span>{" "}
            <span className="whitespace-nowrap">{signed(s.longitudeDeg, "E", "W")},</span>{" "}
            <span className="whitespace-nowrap">{s.elevationM} m</span>
          </span>
        ),
      }),
      column.accessor("minAltitudeDeg", { header: "Lowest altitude", cell: (c) => `${c.getValue()}°` }),
      column.accessor("moonDistanceDeg", { header: "Moon distance", cell: (c) => <span className="whitespace-nowrap">≥&nbsp;{c.getValue()}°</span> }),
      column.accessor("fieldOfViewDeg2", { header: "Field", cell: (c) => `${c.getValue()}\u00a0deg²` }),
      column.accessor("timeZone", { header: "Time zone", cell: (c) => <span className="text-xs">{c.getValue()}</span> }),
      column.accessor("observers", {
        header: "Observers",
        enableSorting: false,
        cell: (c) => (
          <span className="flex flex-wrap gap-1">
            {c.getValue().length === 0 ? <span className="text-xs text-faint">none</span> : null}
            {c.getValue().map((o) => (
              <Avatar key={o.id} name={o.name} initials={o.initials} />
            ))}
          </span>
        ),
      }),
      ...(canManage
        ? [
            column.display({
              id: "actions",
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row: { original: s } }) => (
                <span className="flex gap-1">
                  <Button size="sm" variant="ghost" aria-label={`Edit ${s.code}`} onClick={() => setEditing(s)}>
                    <Pencil aria-hidden className="h-3.5 w-3.5" />
                  </Button>
                  <Button size="sm" variant="ghost" aria-label={`Delete ${s.code}`} onClick={() => setDeleting(s)}>
                    <Trash2 aria-hidden className="h-3.5 w-3.5" />
                  </Button>
                </span>
              ),
            }),
          ]
        : []),
    ],
    [canManage],
  );
  const table = useReactTable({ data: query.data?.sites ?? [], columns, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel() });
  const sites = query.data?.sites ?? [];

  return (
    <div className="space-y-6">
      <section className="space-y-3" aria-labelledby="sites-table-title">
        <div className="flex items-center justify-between">
          <h2 id="sites-table-title" className="text-sm font-semibold uppercase tracking-wide text-muted">
            Sites
          </h2>
          {canManage ? (
            <Button variant="primary" onClick={() => setEditing("new")}>
              <Plus aria-hidden className="h-4 w-4" /> Add site
            </Button>
          ) : (
            <span className="text-xs text-faint">Coordinators add and edit sites.</span>
          )}
        </div>
        {query.isSuccess && sites.length === 0 ? (
          <EmptyState icon={MapPin} title="No sites defined">
            {canManage ? "Add the telescopes that take follow-up tasks: position, altitude limit, field of view and observers." : "Coordinators add sites with their position, altitude limit and field of view."}
          </EmptyState>
        ) : (
          <div className="relative overflow-x-auto rounded-lg border border-line bg-surface">
            <DataTable table={table} caption="Observing sites" testId="sites-table" />
            {query.isLoading ? <p className="p-4 text-sm text-muted">Loading sites…</p> : null}
            {query.isError ? <p className="p-4 text-sm text-alarm">Could not load sites: {errorText(query.error)}</p> : null}
          </div>
        )}
      </section>
      {sites.length ? <InstrumentsPanel sites={sites} canManage={canManage} /> : null}
      {sites.length ? <TonightPanel timeZone={timeZone} /> : null}
      <Dialog
        open={editing !== null}
        onOpenChange={(open) => !open && setEditing(null)}
        title={editing === "new" ? "Add a site" : `Edit ${editing?.code ?? ""}`}
        description="Position (WGS84, east longitude positive), altitude limit, least Moon distance, field of view and the observers who work there."
      >
        {editing !== null ? (
          <SiteForm
            key={editing === "new" ? "new" : editing.id}
            site={editing === "new" ? undefined : editing}
            observerOptions={query.data?.observerOptions ?? []}
            pending={save.isPending}
            onSubmit={(values) => save.mutate({ id: editing === "new" ? undefined : editing.id, values })}
          />
        ) : null}
      </Dialog>
      <Dialog open={deleting !== null} onOpenChange={(open) => !open && setDeleting(null)} title={`Delete ${deleting?.code ?? ""}?`} description="Its tasks stay on the board without a site.">
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={() => setDeleting(null)}>
            Keep it
          </Button>
          <Button variant="danger" disabled={remove.isPending} onClick={() => deleting && remove.mutate(deleting.id)}>
            Delete the site
          </Button>
        </div>
      </Dialog>
    </div>
  );
}
