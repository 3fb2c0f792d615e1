"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { ArrowRight, Moon, Pencil, VolumeX } from "lucide-react";
import { useState } from "react";
import { pagingKeys } from "@/components/paging/query-keys";
import { Button } from "@/components/ui/button";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { apiFetch } from "@/lib/api-client";
import type { EscalationPolicy, EscalationRule } from "@/lib/validations/paging";
import { EscalationPolicyDialog } from "./escalation-policy-dialog";

export const targetLabel = { primary: "On-call primary", backup: "On-call backup", coordinators: "Coordinators" } as const;

export function describeRule(rule: EscalationRule, policy: Pick<EscalationPolicy, "nightStart" | "nightEnd">): string {
  const when = [
    rule.stages.length > 0 ? `stage ${rule.stages.join(" or ")}` : null,
    rule.farAbovePerYear !== null ? `false alarms above ${rule.farAbovePerYear} per year` : null,
    rule.nightOnly ? `${policy.nightStart}–${policy.nightEnd} in the primary's zone` : null,
  ].filter(Boolean);
  const then = rule.action === "none" ? "page nobody" : "tell people in the app only (no push, no e-mail, no escalation)";
  return `${when.length > 0 ? `When ${when.join(", ")}` : "Always"}: ${then}.`;
}

/** The policy in words for everyone; coordinators change it here. */
export function EscalationPolicyPanel({ policy: initial, canEdit }: { policy: EscalationPolicy; canEdit: boolean }) {
  const queryClient = useQueryClient();
  const { data: policy = initial } = useQuery({ queryKey: pagingKeys.policy, queryFn: () => apiFetch<EscalationPolicy>("/api/v1/escalation-policy"), initialData: initial });
  const [editing, setEditing] = useState(false);
  const elapsedAt = policy.steps.map((_, i) => policy.steps.slice(0, i + 1).reduce((sum, s) => sum + s.afterMinutes, 0));
  return (
    <Panel data-testid="escalation-policy">
      <div className="flex items-start justify-between gap-3">
        <PanelTitle>Call-out ladder</PanelTitle>
        {canEdit ? (
          <Button size="sm" variant="ghost" onClick={() => setEditing(true)}>
            <Pencil aria-hidden className="h-4 w-4" /> Change
          </Button>
        ) : null}
      </div>
      <ol className="flex flex-wrap items-center gap-2 text-sm">
        {policy.steps.map((step, i) => {
          const elapsed = elapsedAt[i] ?? 0;
          return (
            <li key={step.target} className="flex items-center gap-2">
              {i > 0 ? <ArrowRight aria-hidden className="h-4 w-4 text-faint" /> : null}
              <span className="rounded-md border border-line bg-raised px-2 py-1">
                <strong>{targetLabel[step.target]}</strong>{" "}
                <span className="text-muted">{elapsed === 0 ? "at once" : `after ${elapsed}\u00a0min unacknowledged`}</span>
              </span>
            </li>
          );
        })}
      </ol>
      <p className="mt-2 text-xs text-faint">An acknowledgement from any channel (board, e-mail link, push action) stops the escalation at once. Nobody on call: coordinators are paged at once.</p>
      {policy.rules.length > 0 ? (
        <ul className="mt-3 space-y-1 text-sm">
          {policy.rules.map((rule) => (
            <li key={rule.name} className="flex items-start gap-2">
              {rule.nightOnly ? <Moon aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-muted" /> : <VolumeX aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-muted" />}
              <span>
                <span className="font-medium">{rule.name}.</span> {describeRule(rule, policy)}
              </span>
            </li>
          ))}
        </ul>
      ) : null}
      {canEdit && editing ? (
        <EscalationPolicyDialog
          policy={policy}
          onClose={() => setEditing(false)}
          onSaved={(next) => {
            queryClient.setQueryData(pagingKeys.policy, next);
            setEditing(false);
          }}
        />
      ) : null}
    </Panel>
  );
}
