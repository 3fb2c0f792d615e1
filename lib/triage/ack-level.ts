export type AckLevel = "waiting" | "warn" | "alarm";

export interface AckDeadlines {
  acknowledgeWarnMinutes: number;
  acknowledgeAlarmMinutes: number;
}

/** Which side of the rota's acknowledgement deadlines (minutes from receipt) an unacknowledged candidate is on. */
export function ackLevel(elapsedS: number, deadlines: AckDeadlines): AckLevel {
  if (elapsedS >= deadlines.acknowledgeAlarmMinutes * 60) return "alarm";
  if (elapsedS >= deadlines.acknowledgeWarnMinutes * 60) return "warn";
  return "waiting";
}

/** Seconds until a merger fitted at `coalescenceTimeS` after `eventTimeMs`, seen at `nowMs` (negative once past). */
export function secondsToMerger(coalescenceTimeS: number | null, eventTimeMs: number, nowMs: number): number {
  return (coalescenceTimeS ?? 0) - (nowMs - eventTimeMs) / 1000;
}
