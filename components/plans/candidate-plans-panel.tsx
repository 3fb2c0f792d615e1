"use client";

import { Download } from "lucide-react";
import Link from "next/link";
import { Badge } from "@/components/ui/badge";
import { formatInZone, isoUtc } from "@/lib/format/time";
import type { PlanRecord } from "@/lib/plans/record";
import { PlanForm, type InstrumentOption } from "./plan-form";
import { useCandidatePlans } from "./use-plans";

const pct = (p: number) => `${(p * 100).toFixed(p < 0.1 ? 1 : 0)} %`;

/** The candidate's pointing plans (each site's tiles are drawn on the sky maps) and a form to make one. */
export function CandidatePlansPanel({
  candidateId,
  initialPlans,
  instruments,
  canPlan,
  timeZone,
}: {
  candidateId: string;
  initialPlans: PlanRecord[];
  instruments: InstrumentOption[];
  canPlan: boolean;
  timeZone: string;
}) {
  const plans = useCandidatePlans(candidateId, initialPlans).data ?? [];
  return (
    <div className="space-y-4" data-testid="candidate-plans">
      {plans.length === 0 ? <p className="text-sm text-muted">No pointing plans yet.</p> : null}
      {plans.length ? (
        <ul className="space-y-2 text-sm">
          {plans.map((p) => {
            const scheduled = p.pointings.filter((q) => q.plannedStart).length;
            return (
              <li key={p.id} className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-md border border-line p-2" data-testid="plan-row">
                <span className="font-medium">
                  {p.site?.code ?? "?"} · {p.instrumentName}
                </span>
                {p.closedAt ? <Badge tone="neutral">Closed</Badge> : null}
                <span className="text-muted">
                  {p.pointings.length} pointings, {scheduled} scheduled · {pct(p.scheduledProbability)} scheduled of {pct(p.totalProbability)}
                </span>
                <span className="text-xs text-faint">
                  made <time dateTime={isoUtc(p.createdAt)}>{formatInZone(p.createdAt, timeZone)}</time>
                  {p.createdBy ? ` by ${p.createdBy.name}` : ""}
                </span>
                <span className="ml-auto flex gap-3 text-xs">
                  {p.taskId ? (
                    <Link className="text-accent hover:underline" href={`/follow-up/${p.taskId}`}>
                      Task
                    </Link>
                  ) : null}
                  <a className="inline-flex items-center gap-1 text-accent hover:underline" href={`/api/v1/plans/${p.id}/export?format=csv`} download data-testid="plan-export-csv">
                    <Download aria-hidden className="h-3.5 w-3.5" /> CSV
                  </a>
                  <a className="inline-flex items-center gap-1 text-accent hover:underline" href={`/api/v1/plans/${p.id}/export?format=json`} download>
                    <Download aria-hidden className="h-3.5 w-3.5" /> JSON
                  </a>
                </span>
              </li>
            );
          })}
        </ul>
      ) : null}
      {canPlan ? <PlanForm candidateId={candidateId} instruments={instruments} /> : null}
      <p className="text-xs text-faint">
        Tiles are chosen greedily for the most probability each (centres on a HEALPix grid finer than the field), then timed at the site: inside
        the window and the astronomical night, above the altitude limit for the whole exposure, clear of the Moon, fields that set first going
        first. Sky another open plan of this candidate already takes does not count again.
      </p>
    </div>
  );
}
