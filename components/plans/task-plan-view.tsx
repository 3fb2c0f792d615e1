"use client";

import { Caution } from "@/components/candidate/caution";
import type { PlanRecord } from "@/lib/plans/record";
import { PlanForm, type InstrumentOption } from "./plan-form";
import { PlanPointings } from "./plan-pointings";
import { useCandidatePlans } from "./use-plans";

/** The task's current pointing plan with its ticks, and a form to make (or replace) it. */
export function TaskPlanView({
  candidateId,
  taskId,
  initialPlans,
  instruments,
  canPlan,
  canTick,
}: {
  candidateId: string;
  taskId: string;
  initialPlans: PlanRecord[];
  instruments: InstrumentOption[];
  canPlan: boolean;
  canTick: boolean;
}) {
  const plans = useCandidatePlans(candidateId, initialPlans);
  const current = (plans.data ?? []).find((p) => p.taskId === taskId && p.closedAt === null) ?? null;
  return (
    <div className="space-y-4">
      {current ? <PlanPointings plan={current} canTick={canTick} /> : <p className="text-sm text-muted">No pointing plan for this task yet.</p>}
      {current ? <Caution /> : null}
      {canPlan ? (
        <details className="rounded-md border border-line p-3" open={!current}>
          <summary className="cursor-pointer text-sm font-medium">{current ? "Replace the plan" : "Plan pointings"}</summary>
          <div className="mt-3">
            <PlanForm candidateId={candidateId} taskId={taskId} instruments={instruments} />
          </div>
        </details>
      ) : null}
    </div>
  );
}
