const MINUTE_S = 60;
const HOUR_S = 3600;
const DAY_S = 86_400;

const pad = (n: number) => String(n).padStart(2, "0");

/**
 * A length of time in at most two units, rounded down: 45 → "45 s", 125 → "2 min 05 s",
 * 3725 → "1 h 02 min", 90061 → "1 d 01 h". Negative values use their magnitude.
 */
export function formatDuration(seconds: number): string {
  if (!Number.isFinite(seconds)) return "—";
  const s = Math.floor(Math.abs(seconds));
  if (s < MINUTE_S) return `${s} s`;
  if (s < HOUR_S) return `${Math.floor(s / MINUTE_S)} min ${pad(s % MINUTE_S)} s`;
  if (s < DAY_S) return `${Math.floor(s / HOUR_S)} h ${pad(Math.floor((s % HOUR_S) / MINUTE_S))} min`;
  return `${Math.floor(s / DAY_S)} d ${pad(Math.floor((s % DAY_S) / HOUR_S))} h`;
}

/** How long ago, coarse: "just now", "3 min ago", "2 h ago", "4 d ago". */
export function formatAge(elapsedSeconds: number): string {
  if (!Number.isFinite(elapsedSeconds)) return "—";
  const s = Math.max(0, Math.floor(elapsedSeconds));
  if (s < 10) return "just now";
  if (s < MINUTE_S) return `${s} s ago`;
  if (s < HOUR_S) return `${Math.floor(s / MINUTE_S)} min ago`;
  if (s < DAY_S) return `${Math.floor(s / HOUR_S)} h ago`;
  return `${Math.floor(s / DAY_S)} d ago`;
}

/** A countdown to merger: "merger in 2 min 05 s" before, "merged 30 s ago" after. */
export function formatCountdown(secondsToMerger: number): string {
  if (!Number.isFinite(secondsToMerger)) return "—";
  return secondsToMerger > 0
    ? `merger in ${formatDuration(secondsToMerger)}`
    : `merged ${formatDuration(-secondsToMerger)} ago`;
}
