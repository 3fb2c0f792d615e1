import { TZDate } from "@date-fns/tz";
import { format } from "date-fns";
import type { DecisionRow, LiveTaskRow } from "@/lib/data/review";
import type { CandidateReview } from "./evaluate";
import { formatDurationMs } from "./format";
import type { ShiftInfo } from "./groups";
import { steps as stepInfo, stepIds, type StepId } from "./steps";

const listLimit = 50;
const undecided = new Set(["new", "acknowledged", "reviewing"]);

export interface HandoffCandidate {
  id: string;
  externalId: string;
  stage: string;
  dominantClass: string | null;
  triageState: string;
  receivedAtMs: number;
}

export interface MissedDeadline {
  candidateId: string;
  externalId: string;
  step: StepId;
  status: "done" | "open";
  durationMs: number;
  deadlineMs: number;
}

/** What one shift leaves to the next: lists are capped at 50 with the totals beside them. */
export interface HandoffSummary {
  shift: ShiftInfo;
  builtAtMs: number;
  received: { total: number; byClass: Record<string, number>; items: HandoffCandidate[] };
  decisions: { total: number; byState: Record<string, number>; items: DecisionRow[] };
  awaitingDecision: { total: number; items: HandoffCandidate[] };
  openTasks: { total: number; items: LiveTaskRow[] };
  missed: { total: number; byStep: Record<StepId, number>; items: MissedDeadline[] };
}

const candidateOf = ({ facts: f }: CandidateReview): HandoffCandidate => ({
  id: f.id,
  externalId: f.externalId,
  stage: f.stage,
  dominantClass: f.dominantClass,
  // A withdrawn candidate is not waiting in its column: say "withdrawn" rather than its last triage state.
  triageState: f.withdrawnAtMs !== null ? "withdrawn" : f.triageState,
  receivedAtMs: f.receivedAtMs,
});

/** Assembles the summary from the shift's candidates (evaluated at `builtAtMs`), its decisions and live tasks. */
export function buildHandoffSummary(input: {
  shift: ShiftInfo;
  builtAtMs: number;
  rows: readonly CandidateReview[];
  deadlinesMs: Record<StepId, number>;
  decisions: readonly DecisionRow[];
  liveTasks: { total: number; rows: LiveTaskRow[] };
}): HandoffSummary {
  const byClass: Record<string, number> = {};
  for (const r of input.rows) {
    const key = r.facts.dominantClass ?? "pending";
    byClass[key] = (byClass[key] ?? 0) + 1;
  }
  const byState: Record<string, number> = {};
  for (const d of input.decisions) byState[d.toState] = (byState[d.toState] ?? 0) + 1;
  const waiting = input.rows.filter((r) => undecided.has(r.facts.triageState) && r.facts.withdrawnAtMs === null);
  const missed: MissedDeadline[] = [];
  const byStep = Object.fromEntries(stepIds.map((s) => [s, 0])) as Record<StepId, number>;
  for (const r of input.rows) {
    // Withdrawn candidates count nowhere as late: their paging stopped when the feed withdrew them.
    if (r.facts.withdrawnAtMs !== null) continue;
    for (const step of stepIds) {
      const t = r.steps[step];
      if (!t.overDeadline || t.durationMs === null || (t.status !== "done" && t.status !== "open")) continue;
      byStep[step] += 1;
      missed.push({
        candidateId: r.facts.id,
        externalId: r.facts.externalId,
        step,
        status: t.status,
        // The acknowledgement is due from receipt (paging + acknowledgement, as on the board): show it that way.
        durationMs: step === "acknowledge" && t.startMs !== null ? t.startMs + t.durationMs - r.facts.receivedAtMs : t.durationMs,
        deadlineMs: step === "acknowledge" ? input.deadlinesMs.page + input.deadlinesMs.acknowledge : input.deadlinesMs[step],
      });
    }
  }
  // Worst first: the furthest past its deadline, relative to the deadline.
  missed.sort((a, b) => b.durationMs / b.deadlineMs - a.durationMs / a.deadlineMs);
  return {
    shift: input.shift,
    builtAtMs: input.builtAtMs,
    received: { total: input.rows.length, byClass, items: input.rows.slice(0, listLimit).map(candidateOf) },
    decisions: { total: input.decisions.length, byState, items: input.decisions.slice(0, listLimit) },
    awaitingDecision: { total: waiting.length, items: waiting.slice(0, listLimit).map(candidateOf) },
    openTasks: { total: input.liveTasks.total, items: input.liveTasks.rows.slice(0, listLimit) },
    missed: { total: missed.length, byStep, items: missed.slice(0, listLimit) },
  };
}

const when = (ms: number, timeZone: string) => `${format(new TZDate(ms, timeZone), "yyyy-MM-dd HH:mm")} ${timeZone}`;
const more = (shown: number, total: number) => (total > shown ? [`  … and ${total - shown} more`] : []);

/** Plain-text e-mail for one recipient, times in their zone. */
export function handoffText(s: HandoffSummary, timeZone: string, link: string): { title: string; body: string } {
  const span = `${when(s.shift.startsAtMs, timeZone)} – ${format(new TZDate(s.shift.endsAtMs, timeZone), "HH:mm")}`;
  const title = `Shift handoff ${span}`;
  const decided = Object.entries(s.decisions.byState).map(([k, n]) => `${n} ${k}`).join(", ") || "none";
  const lines = [
    `Shift ${span} (primary ${s.shift.primaryName}${s.shift.backupName ? `, backup ${s.shift.backupName}` : ""}).`,
    "",
    `Candidates received: ${s.received.total}`,
    ...s.received.items.slice(0, 10).map((c) => `  ${c.externalId}  ${c.stage}, ${c.dominantClass ?? "class pending"}, now ${c.triageState}`),
    ...more(Math.min(10, s.received.items.length), s.received.total),
    `Decisions taken: ${s.decisions.total} (${decided})`,
    `Awaiting a decision: ${s.awaitingDecision.total}`,
    ...s.awaitingDecision.items.slice(0, 10).map((c) => `  ${c.externalId}  ${c.triageState}, received ${when(c.receivedAtMs, timeZone)}`),
    ...more(Math.min(10, s.awaitingDecision.items.length), s.awaitingDecision.total),
    `Open follow-up tasks: ${s.openTasks.total}`,
    ...s.openTasks.items.slice(0, 10).map((t) => `  ${t.externalId}  ${t.kind} at ${t.siteCode ?? "any site"}, ${t.state}${t.claimedByName ? ` (${t.claimedByName})` : ""}`),
    ...more(Math.min(10, s.openTasks.items.length), s.openTasks.total),
    `Deadlines missed: ${s.missed.total}`,
    ...s.missed.items.slice(0, 10).map(
      (m) => `  ${m.externalId}  ${stepInfo[m.step].label}: ${formatDurationMs(m.durationMs)}${m.status === "open" ? " so far" : ""} (deadline ${formatDurationMs(m.deadlineMs)})`,
    ),
    ...more(Math.min(10, s.missed.items.length), s.missed.total),
    "",
    `Printable summary: ${link}`,
  ];
  return { title, body: lines.join("\n") };
}
