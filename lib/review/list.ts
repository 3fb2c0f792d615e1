import { TZDate } from "@date-fns/tz";
import { addWeeks } from "date-fns";
import { loadPeople } from "@/lib/data/review";
import { binKeyOf } from "./histogram";
import { loadReviewScope, type ReviewRequest } from "./report";
import type { StepId } from "./steps";
import type { StepStatus } from "./timeline";


export interface StepListOptions {
  step: StepId;
  /** a histogram bin key (see histogram.ts) */
  bin?: string;
  /** only steps over their deadline */
  late?: boolean;
  /** only candidates received in the week starting at this instant (a trend point) */
  weekStartMs?: number;
  limit: number;
}

export interface StepListRow {
  id: string;
  source: string;
  externalId: string;
  stage: string;
  dominantClass: string | null;
  triageState: string;
  receivedAt: string;
  status: StepStatus;
  durationMs: number | null;
  overDeadline: boolean;
  startedAt: string | null;
  endedAt: string | null;
  actorName: string | null;
}

export interface StepList {
  step: StepId;
  deadlineMs: number;
  total: number;
  rows: StepListRow[];
}

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());

/** The candidates behind a bar: one step's records, slowest first, with the same filters as the page. */
export async function listReviewCandidates(req: ReviewRequest, options: StepListOptions): Promise<StepList | null> {
  const scope = await loadReviewScope(req);
  if (!scope) return null;
  const deadlineMs = scope.deadlinesMs[options.step];
  const week: [number, number] | null =
    options.weekStartMs === undefined
      ? null
      : [options.weekStartMs, addWeeks(new TZDate(options.weekStartMs, req.timeZone), 1).getTime()];
  const matching = scope.rows.filter((r) => {
    const t = r.steps[options.step];
    if (t.status !== "done" && t.status !== "open") return false;
    if (options.late && !t.overDeadline) return false;
    if (options.bin && binKeyOf(t, deadlineMs) !== options.bin) return false;
    if (week && (r.facts.receivedAtMs < week[0] || r.facts.receivedAtMs >= week[1])) return false;
    return true;
  });
  matching.sort((a, b) => (b.steps[options.step].durationMs ?? 0) - (a.steps[options.step].durationMs ?? 0));
  const names = new Map((await loadPeople()).map((p) => [p.id, p.name]));
  const rows = matching.slice(0, options.limit).map(({ facts, steps }): StepListRow => {
    const t = steps[options.step];
    return {
      id: facts.id,
      source: facts.source,
      externalId: facts.externalId,
      stage: facts.stage,
      dominantClass: facts.dominantClass,
      triageState: facts.triageState,
      receivedAt: new Date(facts.receivedAtMs).toISOString(),
      status: t.status,
      durationMs: t.durationMs,
      overDeadline: t.overDeadline,
      startedAt: iso(t.startMs),
      endedAt: iso(t.endMs),
      actorName: t.actorId ? (names.get(t.actorId) ?? null) : null,
    };
  });
  return { step: options.step, deadlineMs, total: matching.length, rows };
}
