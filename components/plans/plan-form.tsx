"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import { apiFetch, ApiClientError, errorText } from "@/lib/api-client";
import type { PlanRecord } from "@/lib/plans/record";

export interface InstrumentOption {
  id: string;
  name: string;
  siteCode: string;
  areaDeg2: number;
}

/**
 * Makes a pointing plan for one instrument: level and the most pointings; the window is the task's (or the site's
 * coming night). The server checks roles and ranges and names the field at fault.
 */
export function PlanForm({ candidateId, taskId, instruments, onPlanned }: { candidateId: string; taskId?: string; instruments: InstrumentOption[]; onPlanned?: (plan: PlanRecord) => void }) {
  const queryClient = useQueryClient();
  const [instrumentId, setInstrumentId] = useState(instruments[0]?.id ?? "");
  const [level, setLevel] = useState("0.9");
  const [maxPointings, setMaxPointings] = useState("50");
  const [avoid, setAvoid] = useState("planned-and-observed");
  const [issues, setIssues] = useState<Record<string, string>>({});
  const plan = useMutation({
    mutationFn: () =>
      apiFetch<PlanRecord>(`/api/v1/candidates/${candidateId}/plans`, {
        method: "POST",
        json: { instrumentId, level: Number(level), maxPointings: Number(maxPointings), avoid, ...(taskId ? { taskId } : {}) },
      }),
    onMutate: () => setIssues({}),
    onSuccess: (made) => {
      const scheduled = made.pointings.filter((p) => p.plannedStart).length;
      toast.success(`Planned ${made.pointings.length} pointings, ${scheduled} scheduled`);
      void queryClient.invalidateQueries({ queryKey: queryKeys.plans(candidateId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.tasks });
      onPlanned?.(made);
    },
    onError: (error) => {
      if (error instanceof ApiClientError && error.body.issues) setIssues(Object.fromEntries(error.body.issues.map((i) => [i.path, i.message])));
      toast.error("Planning refused", { description: errorText(error) });
    },
  });
  if (instruments.length === 0) return <p className="text-sm text-muted">No instrument to plan with: a coordinator adds instruments on the sites page.</p>;
  return (
    <form
      className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4"
      aria-label="Plan pointings"
      onSubmit={(e) => {
        e.preventDefault();
        plan.mutate();
      }}
    >
      <Field label="Instrument" htmlFor={`plan-instrument-${taskId ?? candidateId}`} error={issues.instrumentId}>
        <Select id={`plan-instrument-${taskId ?? candidateId}`} value={instrumentId} onChange={(e) => setInstrumentId(e.target.value)}>
          {instruments.map((i) => (
            <option key={i.id} value={i.id}>
              {i.siteCode} · {i.name} ({i.areaDeg2.toFixed(i.areaDeg2 < 10 ? 1 : 0)} deg²)
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Credible level" htmlFor={`plan-level-${taskId ?? candidateId}`} error={issues.level} hint="0.5 to 0.99">
        <Input id={`plan-level-${taskId ?? candidateId}`} inputMode="decimal" value={level} onChange={(e) => setLevel(e.target.value)} />
      </Field>
      <Field label="At most pointings" htmlFor={`plan-max-${taskId ?? candidateId}`} error={issues.maxPointings} hint="1 to 500">
        <Input id={`plan-max-${taskId ?? candidateId}`} inputMode="numeric" value={maxPointings} onChange={(e) => setMaxPointings(e.target.value)} />
      </Field>
      <Field label="Leave out" htmlFor={`plan-avoid-${taskId ?? candidateId}`} error={issues.avoid ?? issues.end ?? issues.taskId}>
        <Select id={`plan-avoid-${taskId ?? candidateId}`} value={avoid} onChange={(e) => setAvoid(e.target.value)}>
          <option value="planned-and-observed">Sky other plans take, and observed sky</option>
          <option value="observed">Observed sky only</option>
          <option value="none">Nothing</option>
        </Select>
      </Field>
      <div className="sm:col-span-2 lg:col-span-4">
        <Button type="submit" variant="primary" disabled={plan.isPending}>
          {plan.isPending ? "Planning…" : taskId ? "Plan pointings for this task" : "Plan pointings"}
        </Button>
      </div>
    </form>
  );
}
