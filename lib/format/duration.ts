import { NBSP } from "./numbers";

const MINUTE_S = 60;
const HOUR_S = 3600;
const DAY_S = 86_400;

const pad = (n: number) => String(n).padStart(2, "0");

/**
 * A length of time in at most two units, rounded down: 45 → "45 s", 125 → "2 min 05 s",
 * 3725 → "1 h 02 min", 90061 → "1 d 01 h". Negative values use their magnitude. The spaces are no-break spaces:
 * a duration never breaks over two lines.
 */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "—";
  const s = Math.floor(Math.abs(seconds));
  const _ = NBSP;
  if (s < MINUTE_S) return `${s}${_}s`;
  if (s < HOUR_S) return `${Math.floor(s / MINUTE_S)}${_}min${_}${pad(s % MINUTE_S)}${_}s`;
  if (s < DAY_S) return `${Math.floor(s / HOUR_S)}${_}h${_}${pad(Math.floor((s % HOUR_S) / MINUTE_S))}${_}min`;
  return `${Math.floor(s / DAY_S)}${_}d${_}${pad(Math.floor((s % DAY_S) / HOUR_S))}${_}h`;
}

/** How long ago, coarse: "just now", "3 min ago", "2 h ago", "4 d ago". */
export function formatAge(elapsedSeconds: number): string {
  if (!Number.isFinite(elapsedSeconds)) return "—";
  const s = Math.max(0, Math.floor(elapsedSeconds));
  if (s < 10) return "just now";
  if (s < MINUTE_S) return `${s}${NBSP}s ago`;
  if (s < HOUR_S) return `${Math.floor(s / MINUTE_S)}${NBSP}min ago`;
  if (s < DAY_S) return `${Math.floor(s / HOUR_S)}${NBSP}h ago`;
  return `${Math.floor(s / DAY_S)}${NBSP}d ago`;
}

/** A countdown to merger: "merger in 2 min 05 s" before, "merged 30 s ago" after. */
export function formatCountdown(secondsToMerger: number): string {
  if (!Number.isFinite(secondsToMerger)) return "—";
  return secondsToMerger > 0
    ? `merger in ${formatDuration(secondsToMerger)}`
    : `merged ${formatDuration(-secondsToMerger)} ago`;
}
