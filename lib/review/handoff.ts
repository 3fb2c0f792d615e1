import type { Tx } from "@/db";
import { loadDecisions, loadLiveTasks, loadShift } from "@/lib/data/review";
import { buildHandoffSummary, type HandoffSummary } from "./handoff-summary";
import { loadReviewScope } from "./report";

/** A shift that ended longer ago than this gets no e-mail (e.g. the first run over an old rota); it is only marked. */
export const staleHandoffMs = 12 * 3_600_000;

export const handoffPath = (shiftId: string) => `/review/handoff/${encodeURIComponent(shiftId)}`;
export const handoffDedupeKey = (shiftId: string, userId: string) => `handoff:${shiftId}:${userId}`;

/** The end-of-shift summary as of `nowMs` (the printable page and the JSON read it; the e-mails carry it). */
export async function getHandoffSummary(shiftId: string, nowMs: number, q?: Tx): Promise<HandoffSummary | null> {
  const shift = await loadShift(shiftId, q);
  if (!shift) return null;
  const scope = await loadReviewScope({ fromMs: shift.startsAtMs, toMs: shift.endsAtMs, nowMs, timeZone: "UTC" }, q);
  // Without a shift filter the scope always exists; the guard only satisfies the type.
  if (!scope) return null;
  const decisions = await loadDecisions(shift.startsAtMs, shift.endsAtMs, q);
  const liveTasks = await loadLiveTasks(50, q);
  return buildHandoffSummary({ shift, builtAtMs: nowMs, rows: scope.rows, deadlinesMs: scope.deadlinesMs, decisions, liveTasks });
}
