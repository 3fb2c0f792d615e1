"use client";

import { Search } from "lucide-react";
import { useEffect, useState } from "react";
import { Input, Select } from "@/components/ui/field";
import type { TaskKind } from "@/db/schema/tasks";
import { taskKinds } from "@/db/schema/task-values";
import { taskKindLabels } from "@/lib/triage/task-states";
import type { SiteOption } from "./plan-follow-up-dialog";

export interface TaskFilterValues {
  site: string;
  kind: TaskKind | "";
  candidate: string;
  mine: boolean;
}

/** The follow-up board's filters; the board keeps them in the URL so a filtered view can be shared or reloaded. */
export function TaskFilters({ value, sites, onChange }: { value: TaskFilterValues; sites: SiteOption[]; onChange: (next: TaskFilterValues) => void }) {
  const [candidate, setCandidate] = useState(value.candidate);
  useEffect(() => {
    if (candidate.trim() === value.candidate) return;
    const timer = setTimeout(() => onChange({ ...value, candidate: candidate.trim() }), 300);
    return () => clearTimeout(timer);
  }, [candidate, value, onChange]);
  return (
    <form role="search" aria-label="Filter tasks" className="mb-3 grid grid-cols-2 items-end gap-2 sm:flex sm:flex-wrap sm:gap-3" onSubmit={(e) => e.preventDefault()}>
      <label className="min-w-0 text-xs text-muted">
        Site
        <Select className="mt-1 w-full sm:w-48" value={value.site} onChange={(e) => onChange({ ...value, site: e.target.value })}>
          <option value="">All sites</option>
          {sites.map((s) => (
            <option key={s.id} value={s.code}>
              {s.code} · {s.name}
            </option>
          ))}
        </Select>
      </label>
      <label className="min-w-0 text-xs text-muted">
        Kind
        <Select className="mt-1 w-full sm:w-52" value={value.kind} onChange={(e) => onChange({ ...value, kind: e.target.value as TaskKind | "" })}>
          <option value="">All kinds</option>
          {taskKinds.map((k) => (
            <option key={k} value={k}>
              {taskKindLabels[k]}
            </option>
          ))}
        </Select>
      </label>
      <label className="min-w-0 text-xs text-muted">
        Candidate
        <span className="relative mt-1 block">
          <Search aria-hidden className="pointer-events-none absolute left-2.5 top-2.5 h-4 w-4 text-faint" />
          <Input className="w-full pl-8 sm:w-48" value={candidate} placeholder="id or name" onChange={(e) => setCandidate(e.target.value)} />
        </span>
      </label>
      <label className="flex items-center gap-2 pb-2 text-sm">
        <input type="checkbox" className="h-4 w-4 accent-[var(--c-accent)]" checked={value.mine} onChange={(e) => onChange({ ...value, mine: e.target.checked })} />
        Only mine
      </label>
    </form>
  );
}
