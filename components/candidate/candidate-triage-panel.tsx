"use client";

import { ArrowRight } from "lucide-react";
import dynamic from "next/dynamic";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { toast } from "sonner";
import { toastRefusal } from "@/components/board/mutation-errors";
import type { SiteOption } from "@/components/board/plan-follow-up-dialog";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import type { TriageState } from "@/db/schema/candidates";
import { apiFetch } from "@/lib/api-client";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { allowedTransitions, triageLabels } from "@/lib/triage/transitions";
import type { TaskDraft } from "@/lib/validations/tasks";

const DismissDialog = dynamic(() => import("@/components/board/dismiss-dialog"), { ssr: false });
const PlanFollowUpDialog = dynamic(() => import("@/components/board/plan-follow-up-dialog"), { ssr: false });

export interface TriagePanelState {
  id: string;
  externalId: string;
  triageState: TriageState;
  version: number;
  withdrawn: boolean;
  owner: { name: string; initials: string } | null;
  acknowledgedAt: number | null;
  acknowledgedBy: string | null;
  decidedAt: number | null;
  dismissReason: string | null;
}

/** The candidate's triage state and the same moves as the board, as buttons (the page refreshes after each). */
export function CandidateTriagePanel({ state, canTriage, canPlan, sites, timeZone }: { state: TriagePanelState; canTriage: boolean; canPlan: boolean; sites: SiteOption[]; timeZone: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [dialog, setDialog] = useState<"dismiss" | "pursue" | "plan" | null>(null);

  const move = async (to: TriageState, reason?: string): Promise<boolean> => {
    setBusy(true);
    try {
      await apiFetch(`/api/v1/candidates/${state.id}/triage`, { method: "POST", json: { to, reason, via: "menu", expectedVersion: state.version } });
      toast.success(`${state.externalId} → ${triageLabels[to]}`);
      return true;
    } catch (error) {
      toastRefusal(error, "Moving the candidate");
      return false;
    } finally {
      setBusy(false);
      router.refresh();
    }
  };
  const createTasks = async (tasks: TaskDraft[]) => {
    if (!tasks.length) return;
    try {
      await apiFetch(`/api/v1/candidates/${state.id}/tasks`, { method: "POST", json: { tasks } });
      toast.success(`${tasks.length} follow-up task${tasks.length === 1 ? "" : "s"} created`);
    } catch (error) {
      toastRefusal(error, "Creating the follow-up tasks");
    }
    router.refresh();
  };

  const when = (t: number | null) => (t === null ? null : <time dateTime={isoUtc(t)} title={isoUtc(t)}>{formatInZone(t, timeZone)}</time>);
  return (
    <div className="space-y-3 text-sm">
      <p className="text-lg font-semibold" data-testid="triage-state">
        {triageLabels[state.triageState]}
      </p>
      <dl className="space-y-1">
        <div className="flex items-center gap-2">
          <dt className="text-muted">Owner</dt>
          <dd className="flex items-center gap-1.5">{state.owner ? <><Avatar name={state.owner.name} initials={state.owner.initials} className="h-5 w-5" />{state.owner.name}</> : "nobody"}</dd>
        </div>
        <div className="flex flex-wrap gap-x-2">
          <dt className="text-muted">Acknowledged</dt>
          <dd>{state.acknowledgedAt ? <>by {state.acknowledgedBy ?? "someone"}, {when(state.acknowledgedAt)}</> : "not yet"}</dd>
        </div>
        {state.decidedAt ? (
          <div className="flex flex-wrap gap-x-2">
            <dt className="text-muted">Decided</dt>
            <dd>{when(state.decidedAt)}</dd>
          </div>
        ) : null}
        {state.dismissReason ? (
          <div className="flex flex-wrap gap-x-2">
            <dt className="text-muted">Reason</dt>
            <dd>“{state.dismissReason}”</dd>
          </div>
        ) : null}
      </dl>
      {canTriage ? (
        <div className="flex flex-wrap gap-2">
          {allowedTransitions[state.triageState].map((to) => (
            <Button
              key={to}
              size="sm"
              disabled={busy || (to === "pursue" && state.withdrawn)}
              variant={to === "dismissed" ? "danger" : to === "pursue" ? "primary" : "secondary"}
              onClick={() => (to === "dismissed" ? setDialog("dismiss") : to === "pursue" ? setDialog("pursue") : void move(to))}
            >
              <ArrowRight aria-hidden className="h-3.5 w-3.5" />
              {triageLabels[to]}
            </Button>
          ))}
        </div>
      ) : (
        <p className="text-xs text-muted">Shifters and coordinators change the triage state.</p>
      )}
      {canPlan && state.triageState === "pursue" && !state.withdrawn ? (
        <Button size="sm" variant="secondary" onClick={() => setDialog("plan")}>
          Plan more follow-up
        </Button>
      ) : null}
      {dialog === "dismiss" ? (
        <DismissDialog
          externalId={state.externalId}
          onCancel={() => setDialog(null)}
          onConfirm={(reason) => {
            setDialog(null);
            void move("dismissed", reason);
          }}
        />
      ) : null}
      {dialog === "pursue" || dialog === "plan" ? (
        <PlanFollowUpDialog
          candidateId={state.id}
          externalId={state.externalId}
          sites={sites}
          onCancel={() => setDialog(null)}
          onSubmit={async (tasks) => {
            const moved = dialog === "plan" ? true : await move("pursue");
            setDialog(null);
            if (moved) await createTasks(tasks);
          }}
        />
      ) : null}
    </div>
  );
}
