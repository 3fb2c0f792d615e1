import type { Tx } from "@/db";
import { userTimeZone } from "@/lib/data/paging-people";
import { findShiftAt } from "@/lib/data/rota";
import { getSetting } from "@/lib/data/settings";
import type { EscalationPolicy } from "@/lib/validations/paging";
import { planPaging, type PagingCircumstances, type PagingPlan } from "./policy";

/** How loudly a plan reaches people: nobody, in the app only, or paged on every channel. */
const loudness: Record<PagingPlan["action"], number> = { none: 0, "in-app-only": 1, page: 2 };

export interface HeadlineForPaging {
  stage: string;
  falseAlarmRatePerYear: number;
}

/**
 * The re-page rule for a trigger joining a candidate (lib/services/join-trigger.ts). The candidate was paged once, by its
 * headline then; a joining trigger pages again only when the call-out ladder, judging the candidate's new headline
 * (its preferred trigger after the join), would reach people more loudly than it did for the headline before the
 * join: nobody → in the app → paged. That is what a lower false-alarm rate crossing a rule's threshold, or a stage
 * that a rule treats differently, does. A stage counts as "more urgent" only through the ladder's own rules, so
 * paging has one definition of urgency. Both are judged at the join's receipt, by the same clock and shift.
 */
export function pagesLouder(
  policy: EscalationPolicy,
  before: HeadlineForPaging,
  after: HeadlineForPaging,
  circumstances: Omit<PagingCircumstances, "stage" | "falseAlarmRatePerYear">,
): boolean {
  const was = planPaging(policy, { ...circumstances, ...before });
  const now = planPaging(policy, { ...circumstances, ...after });
  return loudness[now.action] > loudness[was.action];
}

/** pagesLouder with the stored ladder and the on-call primary's time zone at `receivedAt`. */
export async function joinPagesLouder(tx: Tx, before: HeadlineForPaging, after: HeadlineForPaging, receivedAt: Date, now: Date) {
  if (before.stage === after.stage && before.falseAlarmRatePerYear === after.falseAlarmRatePerYear) return false;
  const policy = await getSetting("escalation", tx);
  const shift = await findShiftAt(tx, receivedAt);
  const primaryTimeZone = (shift ? await userTimeZone(tx, shift.primaryId) : null) ?? "UTC";
  return pagesLouder(policy, before, after, { receivedAt, now, primaryTimeZone });
}
