import type { EscalationPolicy, EscalationRule, EscalationTarget, PolicyAction } from "@/lib/validations/paging";
import { isWithinLocalWindow } from "./local-time";

export interface PagingCircumstances {
  stage: string;
  falseAlarmRatePerYear: number;
  receivedAt: Date;
  /** the on-call primary's time zone, for night rules; UTC when nobody is on call */
  primaryTimeZone: string;
  /** the instant the paging decision is made (the hook's clock) */
  now: Date;
}

export interface PlannedStep {
  step: number;
  target: EscalationTarget;
  dueAt: Date;
}

export interface PagingPlan {
  /** "page": push and e-mail and in-app; "in-app-only": no push or e-mail; "none": nobody */
  action: "page" | PolicyAction;
  /** the rule that decided, or why nobody is paged */
  reason: string;
  steps: PlannedStep[];
}

function ruleMatches(rule: EscalationRule, c: PagingCircumstances, policy: EscalationPolicy): boolean {
  if (rule.stages.length > 0 && !rule.stages.some((s) => s === c.stage)) return false;
  if (rule.farAbovePerYear !== null && !(c.falseAlarmRatePerYear > rule.farAbovePerYear)) return false;
  if (rule.nightOnly && !isWithinLocalWindow(c.receivedAt, c.primaryTimeZone, policy.nightStart, policy.nightEnd)) {
    return false;
  }
  return true;
}

/** Which steps run and when: cumulative delays from receipt; the first matching rule may silence or soften them. */
export function planPaging(policy: EscalationPolicy, c: PagingCircumstances): PagingPlan {
  let elapsedMs = 0;
  const steps = policy.steps.map((s, index) => {
    elapsedMs += s.afterMinutes * 60_000;
    return { step: index, target: s.target, dueAt: new Date(c.receivedAt.getTime() + elapsedMs) };
  });
  if (c.now.getTime() - c.receivedAt.getTime() > policy.maxAgeMinutes * 60_000) {
    return { action: "none", reason: `received more than ${policy.maxAgeMinutes} min ago`, steps: [] };
  }
  const rule = policy.rules.find((r) => ruleMatches(r, c, policy));
  if (!rule) return { action: "page", reason: "default policy", steps };
  if (rule.action === "none") return { action: "none", reason: rule.name, steps: [] };
  // In-app only: everyone the steps would reach hears of it at once in the app, with no timers.
  return { action: "in-app-only", reason: rule.name, steps: steps.map((s) => ({ ...s, dueAt: c.receivedAt })) };
}
