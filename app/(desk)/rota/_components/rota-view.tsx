"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ChevronLeft, ChevronRight, Plus } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { toast } from "sonner";
import { pagingKeys } from "@/components/paging/query-keys";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { apiFetch } from "@/lib/api-client";
import { formatInZone } from "@/lib/format/time";
import { localDateKey, weekDays } from "@/lib/notify/rota-week";
import { RotaIssues } from "./rota-issues";
import { ShiftDialog } from "./shift-dialog";
import { ShiftTable } from "./shift-table";
import type { RotaPerson, RotaResponse, ShiftView } from "./types";
import { WeekGrid } from "./week-grid";

const DAY_MS = 86_400_000;

/** One week of the rota in the viewer's zone: grid, flags, table, and (for coordinators) the forms. */
export function RotaView({ weekStart, timeZone, people, canEdit, nowMs }: { weekStart: number; timeZone: string; people: RotaPerson[]; canEdit: boolean; nowMs: number }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const days = weekDays(weekStart, timeZone);
  const from = new Date(days[0]?.startMs ?? weekStart).toISOString();
  const to = new Date(days[6]?.endMs ?? weekStart + 7 * DAY_MS).toISOString();
  const rota = useQuery({
    queryKey: pagingKeys.rota(from, to),
    queryFn: () => apiFetch<RotaResponse>(`/api/v1/rota?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}`),
  });
  const [editing, setEditing] = useState<{ shift: ShiftView | null } | null>(null);
  const [deleting, setDeleting] = useState<ShiftView | null>(null);
  const refresh = () => queryClient.invalidateQueries({ queryKey: ["paging", "rota"] });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/rota/${encodeURIComponent(id)}`, { method: "DELETE" }),
    onSuccess: () => toast.success("Shift removed."),
    onError: (e) => toast.error(e.message),
    onSettled: () => {
      setDeleting(null);
      void refresh();
    },
  });

  const goTo = (ms: number) => router.push(`/rota?week=${localDateKey(ms, timeZone)}`);
  const shifts = rota.data?.shifts ?? [];
  const issues = rota.data?.issues ?? [];
  const lastEnd = shifts.reduce((max, s) => Math.max(max, Date.parse(s.endsAt)), 0);
  const newDefaults = { startsAt: lastEnd || days[0]?.startMs || weekStart, endsAt: (lastEnd || days[0]?.startMs || weekStart) + 8 * 3_600_000 };

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-center gap-2">
        <Button size="sm" variant="secondary" aria-label="Previous week" onClick={() => goTo(weekStart - 3 * DAY_MS)}>
          <ChevronLeft aria-hidden className="h-4 w-4" />
        </Button>
        <Button size="sm" variant="secondary" onClick={() => goTo(nowMs)}>
          This week
        </Button>
        <Button size="sm" variant="secondary" aria-label="Next week" onClick={() => goTo(weekStart + 10 * DAY_MS)}>
          <ChevronRight aria-hidden className="h-4 w-4" />
        </Button>
        <span className="text-sm font-medium">
          {days[0]?.label} – {days[6]?.label} <span className="text-muted">({timeZone})</span>
        </span>
        {canEdit ? (
          <Button size="sm" variant="primary" className="ml-auto" onClick={() => setEditing({ shift: null })}>
            <Plus aria-hidden className="h-4 w-4" /> Add shift
          </Button>
        ) : null}
      </div>
      {rota.isError ? <p role="alert" className="text-sm text-alarm">Could not load the rota: {rota.error.message}</p> : null}
      <Panel>
        <PanelTitle>Coverage</PanelTitle>
        {rota.isPending ? <p className="text-sm text-muted">Loading…</p> : <RotaIssues issues={issues} shifts={shifts} timeZone={timeZone} />}
      </Panel>
      <Panel>
        <PanelTitle>Week</PanelTitle>
        <WeekGrid weekStart={weekStart} timeZone={timeZone} shifts={shifts} issues={issues} nowMs={nowMs} onSelect={canEdit ? (shift) => setEditing({ shift }) : undefined} />
      </Panel>
      <Panel>
        <PanelTitle>Shifts</PanelTitle>
        {shifts.length === 0 && rota.isSuccess ? (
          <p className="text-sm text-muted">No shifts this week.{canEdit ? " Add one to put someone on call." : " Coordinators plan the rota."}</p>
        ) : (
          <ShiftTable shifts={shifts} issues={issues} timeZone={timeZone} onEdit={canEdit ? (shift) => setEditing({ shift }) : undefined} onDelete={canEdit ? setDeleting : undefined} />
        )}
      </Panel>
      {canEdit && editing ? (
        <ShiftDialog open onOpenChange={(o) => !o && setEditing(null)} shift={editing.shift} defaults={newDefaults} people={people} timeZone={timeZone} onSaved={() => void refresh()} />
      ) : null}
      {canEdit && deleting ? (
        <Dialog open onOpenChange={(o) => !o && setDeleting(null)} title="Remove this shift?" description={`${deleting.primary.name}, ${formatInZone(deleting.startsAt, timeZone)} – ${formatInZone(deleting.endsAt, timeZone)}`}>
          <p className="mb-4 text-sm text-muted">Candidates arriving in a gap page the coordinators directly.</p>
          <div className="flex justify-end gap-2">
            <Button onClick={() => setDeleting(null)}>Keep</Button>
            <Button variant="danger" onClick={() => remove.mutate(deleting.id)} disabled={remove.isPending}>
              Remove shift
            </Button>
          </div>
        </Dialog>
      ) : null}
    </div>
  );
}
