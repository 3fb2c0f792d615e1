import type { ShiftInfo } from "@/lib/data/review";
import type { CandidateReview } from "./evaluate";
import { stepIds, type StepId } from "./steps";
import { FiguresAccumulator, summariseSteps, type StepFigures } from "./summary";

export type { ShiftInfo } from "@/lib/data/review";

export interface ShiftRow extends ShiftInfo {
  candidates: number;
  steps: Record<StepId, StepFigures>;
}

export interface PersonRow {
  id: string;
  name: string;
  role: string;
  /** candidates this person finished at least one step of */
  candidates: number;
  steps: Record<StepId, StepFigures>;
}

/** Candidates received during each shift ([startsAt, endsAt)), with the same figures as the page. */
export function shiftRows(rows: readonly CandidateReview[], shifts: readonly ShiftInfo[]): ShiftRow[] {
  const byReceipt = [...rows].sort((a, b) => a.facts.receivedAtMs - b.facts.receivedAtMs);
  return shifts.map((shift) => {
    const inShift = sliceByReceipt(byReceipt, shift.startsAtMs, shift.endsAtMs);
    return { ...shift, candidates: inShift.length, steps: summariseSteps(inShift) };
  });
}

/** Binary search on receipt time: shifts × candidates stays O(s log n), not O(s·n). */
function sliceByReceipt(sorted: readonly CandidateReview[], fromMs: number, toMs: number): CandidateReview[] {
  const lowerBound = (t: number) => {
    let lo = 0;
    let hi = sorted.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if ((sorted[mid] as CandidateReview).facts.receivedAtMs < t) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  return sorted.slice(lowerBound(fromMs), lowerBound(toMs));
}

/** Figures per person over the steps they finished (acknowledged, decided, claimed, reported). */
export function personRows(
  rows: readonly CandidateReview[],
  people: ReadonlyArray<{ id: string; name: string; role: string }>,
): PersonRow[] {
  const byPerson = new Map<string, { accs: Map<StepId, FiguresAccumulator>; candidates: Set<string> }>();
  for (const row of rows) {
    for (const step of stepIds) {
      const timing = row.steps[step];
      if (timing.status !== "done" || !timing.actorId) continue;
      let entry = byPerson.get(timing.actorId);
      if (!entry) {
        entry = { accs: new Map(), candidates: new Set() };
        byPerson.set(timing.actorId, entry);
      }
      entry.candidates.add(row.facts.id);
      let acc = entry.accs.get(step);
      if (!acc) {
        acc = new FiguresAccumulator();
        entry.accs.set(step, acc);
      }
      acc.add(timing);
    }
  }
  const names = new Map(people.map((p) => [p.id, p]));
  return [...byPerson.entries()].map(([id, entry]) => {
    const figures = {} as Record<StepId, StepFigures>;
    for (const step of stepIds) figures[step] = (entry.accs.get(step) ?? new FiguresAccumulator()).result();
    const person = names.get(id);
    return { id, name: person?.name ?? "(removed account)", role: person?.role ?? "", candidates: entry.candidates.size, steps: figures };
  });
}
