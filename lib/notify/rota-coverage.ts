/** A shift as the coverage check needs it. */
export interface ShiftSpan {
  id: string;
  startsAt: number;
  endsAt: number;
}

export type RotaIssue =
  | { kind: "overlap"; shiftIds: [string, string]; from: number; to: number }
  | { kind: "gap"; from: number; to: number };

/**
 * Overlaps between shifts and stretches of [rangeStart, rangeEnd) with nobody on call, in time order.
 * Times are Unix ms.
 */
export function findRotaIssues(shifts: readonly ShiftSpan[], rangeStart: number, rangeEnd: number): RotaIssue[] {
  const sorted = [...shifts].sort((a, b) => a.startsAt - b.startsAt || a.endsAt - b.endsAt);
  const issues: RotaIssue[] = [];
  for (let i = 0; i < sorted.length; i++) {
    const a = sorted[i];
    if (!a) continue;
    for (let j = i + 1; j < sorted.length; j++) {
      const b = sorted[j];
      if (!b || b.startsAt >= a.endsAt) break;
      issues.push({ kind: "overlap", shiftIds: [a.id, b.id], from: b.startsAt, to: Math.min(a.endsAt, b.endsAt) });
    }
  }
  let coveredUntil = rangeStart;
  for (const s of sorted) {
    if (s.endsAt <= coveredUntil) continue;
    if (s.startsAt > coveredUntil && coveredUntil < rangeEnd) {
      issues.push({ kind: "gap", from: coveredUntil, to: Math.min(s.startsAt, rangeEnd) });
    }
    coveredUntil = Math.max(coveredUntil, s.endsAt);
    if (coveredUntil >= rangeEnd) break;
  }
  if (coveredUntil < rangeEnd) issues.push({ kind: "gap", from: coveredUntil, to: rangeEnd });
  return issues.sort((x, y) => x.from - y.from);
}
