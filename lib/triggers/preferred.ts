/**
 * Which trigger of a candidate speaks for it. Pure: no SQL, no clock.
 *
 * Rule ("lowest-far", the default): among the triggers not withdrawn (all of them when every one is), the lowest
 * false-alarm rate; ties to the highest network SNR; then the earliest received; then the smaller id, so the
 * choice never depends on row order. "highest-snr" swaps the first two keys. Ranking by false-alarm rate first is
 * common practice: it is the number a pipeline calibrates against its own background, while SNRs of different
 * pipelines are not on one scale.
 */
export const preferredRules = ["lowest-far", "highest-snr"] as const;
export type PreferredRule = (typeof preferredRules)[number];

export interface RankedTrigger {
  id: string;
  falseAlarmRatePerYear: number;
  networkSnr: number;
  receivedAtMs: number;
  withdrawn: boolean;
}

/** Negative when a ranks before b. */
export function compareTriggers(a: RankedTrigger, b: RankedTrigger, rule: PreferredRule): number {
  const far = a.falseAlarmRatePerYear - b.falseAlarmRatePerYear;
  const snr = b.networkSnr - a.networkSnr;
  const [first, second] = rule === "lowest-far" ? [far, snr] : [snr, far];
  if (first !== 0) return first;
  if (second !== 0) return second;
  if (a.receivedAtMs !== b.receivedAtMs) return a.receivedAtMs - b.receivedAtMs;
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/** The preferred trigger, or null for none. */
export function choosePreferred<T extends RankedTrigger>(triggers: readonly T[], rule: PreferredRule): T | null {
  const live = triggers.filter((t) => !t.withdrawn);
  const pool = live.length > 0 ? live : triggers;
  let best: T | null = null;
  for (const t of pool) if (!best || compareTriggers(t, best, rule) < 0) best = t;
  return best;
}
