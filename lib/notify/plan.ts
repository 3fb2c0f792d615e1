import type { Tx } from "@/db";
import { insertEscalationTimers } from "@/lib/data/escalations";
import { appendEvent } from "@/lib/data/events";
import { readCandidateRow, readPageExtras, userTimeZone } from "@/lib/data/paging-people";
import { findShiftAt } from "@/lib/data/rota";
import { getSetting } from "@/lib/data/settings";
import { eventKinds } from "@/lib/events/kinds";
import { candidateTextFor, type CandidateSummary } from "./content";
import { candidatePath } from "./links";
import { queueNotifications } from "./outbox";
import { planPaging } from "./policy";
import { coordinators, resolveTarget, targetRoleLabel, type Recipient } from "./recipients";

export interface NewCandidateInfo {
  candidateId: string;
  eventId: number;
  stage: string;
  falseAlarmRatePerYear: number;
  receivedAt: Date;
  candidate?: CandidateSummary;
}

/** The candidate row plus what a page adds to it (distance, sky area). */
export async function readCandidateSummary(tx: Tx, candidateId: string): Promise<CandidateSummary | null> {
  const row = await readCandidateRow(tx, candidateId);
  if (!row) return null;
  return { ...row, ...(await readPageExtras(tx, row)) };
}

/**
 * A new candidate: page the first step that reaches anyone (normally the on-call primary) on every channel,
 * and store the later steps as escalation timers. A policy rule may instead page nobody, or reach everyone the
 * steps would reach in the app only.
 */
export async function pageNewCandidate(tx: Tx, info: NewCandidateInfo, now: Date): Promise<void> {
  const candidate = info.candidate ?? (await readCandidateSummary(tx, info.candidateId));
  if (!candidate) return;
  const policy = await getSetting("escalation", tx);
  const shift = await findShiftAt(tx, info.receivedAt);
  const primaryTimeZone = (shift ? await userTimeZone(tx, shift.primaryId) : null) ?? "UTC";
  const plan = planPaging(policy, { ...info, primaryTimeZone, now });
  if (plan.action === "none") return;

  const path = candidatePath(info.candidateId);
  if (plan.action === "in-app-only") {
    const everyone: Recipient[] = [];
    for (const step of plan.steps) everyone.push(...(await resolveTarget(tx, step.target, shift)));
    if (everyone.length === 0) everyone.push(...(await coordinators(tx)));
    const userIds = everyone.map((r) => r.id);
    const text = candidateTextFor(candidate, { kind: "notice", reason: plan.reason });
    await queueNotifications(tx, { eventId: info.eventId, kind: "notice", ...text, path, candidateId: info.candidateId, channels: [], now }, userIds);
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.pageQueued,
      candidateId: info.candidateId,
      data: { userIds, channels: ["in-app"], reason: "new-candidate", rule: plan.reason },
    });
    return;
  }

  let first = 0;
  let recipients: Recipient[] = [];
  for (; first < plan.steps.length; first++) {
    const step = plan.steps[first];
    if (!step) break;
    recipients = await resolveTarget(tx, step.target, shift);
    if (recipients.length > 0) break;
  }
  // Nobody the policy names can be reached (no shift covers the receipt): the coordinators, at once.
  const firstStep = plan.steps[first] ?? { step: plan.steps.length, target: "coordinators" as const, dueAt: info.receivedAt };
  if (recipients.length === 0) recipients = await coordinators(tx);
  if (recipients.length > 0) {
    const text = candidateTextFor(candidate, { kind: "page", role: targetRoleLabel[firstStep.target] });
    const userIds = recipients.map((r) => r.id);
    await queueNotifications(
      tx,
      {
        eventId: info.eventId,
        kind: "page",
        ...text,
        path,
        candidateId: info.candidateId,
        channels: ["push", "email"],
        onCall: firstStep.target === "primary",
        ackable: true,
        now,
      },
      userIds,
    );
    await appendEvent(tx, {
      at: now,
      kind: eventKinds.pageQueued,
      candidateId: info.candidateId,
      data: { userIds, channels: ["push", "email", "in-app"], reason: "new-candidate", step: firstStep.step, target: firstStep.target },
    });
  }
  await insertEscalationTimers(tx, info.candidateId, plan.steps.slice(first + 1), now);
}
