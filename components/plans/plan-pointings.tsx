"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { Check, Download } from "lucide-react";
import { toastRefusal } from "@/components/board/mutation-errors";
import { queryKeys } from "@/components/live/query-keys";
import { formatDec, formatRa } from "@/components/skymap/format";
import { Badge } from "@/components/ui/badge";
import { cn } from "@/components/ui/cn";
import { apiFetch } from "@/lib/api-client";
import { formatClock, isoUtc } from "@/lib/format/time";
import type { PlanRecord, PointingRecord } from "@/lib/plans/record";

const reasonLabels: Record<string, string> = {
  "not-observable-in-window": "not above the altitude limit at night in the window",
  "too-close-to-moon": "too close to the Moon",
  "no-time-left": "no time left in the window",
};

const pct = (p: number) => `${(p * 100).toFixed(p < 0.1 ? 1 : 0)} %`;

/** Scheduled pointings in time order, then the ones without a time by number. */
export function observingOrder(pointings: readonly PointingRecord[]): PointingRecord[] {
  const at = (p: PointingRecord) => (p.plannedStart ? Date.parse(p.plannedStart) : Number.POSITIVE_INFINITY);
  return [...pointings].sort((a, b) => at(a) - at(b) || a.index - b.index);
}

/** A plan's pointings as the observer works through them: planned times (UTC and the site's), altitude, Moon, a tick. */
export function PlanPointings({ plan, canTick }: { plan: PlanRecord; canTick: boolean }) {
  const queryClient = useQueryClient();
  const siteZone = plan.site?.timeZone ?? "UTC";
  const tick = useMutation({
    mutationFn: ({ pointing, done }: { pointing: PointingRecord; done: boolean }) =>
      apiFetch(`/api/v1/plans/${plan.id}/pointings/${pointing.id}`, { method: "PATCH", json: { done } }),
    // optimistic: the box shows the tick at once; a refusal puts the plans back as they were
    onMutate: async ({ pointing, done }) => {
      const key = queryKeys.plans(plan.candidateId);
      await queryClient.cancelQueries({ queryKey: key });
      const before = queryClient.getQueryData<PlanRecord[]>(key);
      const doneAt = done ? new Date().toISOString() : null;
      queryClient.setQueryData<PlanRecord[]>(key, (plans) =>
        plans?.map((pl) => (pl.id === plan.id ? { ...pl, pointings: pl.pointings.map((q) => (q.id === pointing.id ? { ...q, doneAt } : q)) } : pl)),
      );
      return { before };
    },
    onError: (error, _vars, context) => {
      if (context?.before) queryClient.setQueryData(queryKeys.plans(plan.candidateId), context.before);
      toastRefusal(error, "Ticking the pointing");
    },
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: queryKeys.plans(plan.candidateId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.tasks });
    },
  });
  const scheduled = plan.pointings.filter((p) => p.plannedStart).length;
  const done = plan.pointings.filter((p) => p.doneAt).length;
  return (
    <section className="space-y-3" aria-label={`Pointings of the plan for ${plan.site?.code ?? "the site"}`} data-testid="plan-pointings">
      <div className="flex flex-wrap items-center gap-2 text-sm">
        <span className="font-medium">
          {plan.site?.code ?? "Site"} · {plan.instrumentName}
        </span>
        <Badge tone="accent">{plan.pointings.length} pointings</Badge>
        <span className="text-muted">
          {scheduled} scheduled · {pct(plan.scheduledProbability)} of the probability scheduled ({pct(plan.totalProbability)} planned) · {done} done
        </span>
        <span className="ml-auto flex gap-3 text-xs">
          <a className="inline-flex items-center gap-1 text-accent hover:underline" href={`/api/v1/plans/${plan.id}/export?format=csv`} download>
            <Download aria-hidden className="h-3.5 w-3.5" /> CSV
          </a>
          <a className="inline-flex items-center gap-1 text-accent hover:underline" href={`/api/v1/plans/${plan.id}/export?format=json`} download>
            <Download aria-hidden className="h-3.5 w-3.5" /> JSON
          </a>
        </span>
      </div>
      <p className="text-xs text-faint">
        {plan.exposureS} s exposures{plan.filter ? ` in ${plan.filter}` : ""}, {plan.overheadS} s overhead each; altitude and Moon distance at the planned start. Times in UTC
        and at the site ({siteZone}).
      </p>
      <ol className="divide-y divide-line rounded-md border border-line">
        {observingOrder(plan.pointings).map((p) => {
          const label = `Pointing ${p.index}${p.doneAt ? ", done" : ""}`;
          return (
            <li key={p.id} className={cn("flex flex-wrap items-center gap-x-3 gap-y-1 px-2 py-2 text-sm", p.doneAt && "bg-ok/5")} data-testid="plan-pointing">
              {canTick ? (
                <label className="flex h-10 w-10 shrink-0 cursor-pointer items-center justify-center rounded-md border border-line bg-sunken has-[:checked]:border-ok has-[:checked]:bg-ok/15">
                  <input
                    type="checkbox"
                    className="peer sr-only"
                    checked={p.doneAt !== null}
                    disabled={plan.closedAt !== null}
                    onChange={(e) => tick.mutate({ pointing: p, done: e.target.checked })}
                    aria-label={`Mark pointing ${p.index} done`}
                  />
                  <Check aria-hidden className="h-5 w-5 text-ok opacity-0 peer-checked:opacity-100" />
                </label>
              ) : p.doneAt ? (
                <Check aria-label="done" className="h-5 w-5 shrink-0 text-ok" />
              ) : null}
              <span className="w-8 shrink-0 font-mono font-semibold" aria-label={label}>
                #{p.index}
              </span>
              <span className="font-mono text-xs">
                {formatRa(p.raDeg)} {formatDec(p.decDeg)}
              </span>
              {p.plannedStart ? (
                <>
                  <time dateTime={isoUtc(p.plannedStart)} className="font-mono text-xs">
                    {formatClock(p.plannedStart, "UTC")} · {formatClock(p.plannedStart, siteZone)}
                  </time>
                  <span className="text-xs text-muted">
                    alt {p.altitudeDeg?.toFixed(0)}° · Moon {p.moonSeparationDeg?.toFixed(0)}°
                  </span>
                </>
              ) : (
                <span className="text-xs text-warn">not scheduled: {reasonLabels[p.unscheduledReason ?? ""] ?? p.unscheduledReason}</span>
              )}
              <span className="ml-auto text-xs text-muted" title="probability this pointing adds to the ones before it">
                +{pct(p.gainedProbability)}
              </span>
            </li>
          );
        })}
      </ol>
    </section>
  );
}
