/** A duration for people: "42 s", "3 min 05 s", "2 h 10 min", "3 d 4 h"; negative ones keep their sign. */
export function formatDurationMs(ms: number | null): string {
  if (ms === null || !Number.isFinite(ms)) return "—";
  if (ms < 0) return `−${formatDurationMs(-ms)}`;
  const totalSeconds = Math.round(ms / 1000);
  if (totalSeconds < 60) return ms < 1000 && ms > 0 ? `${(ms / 1000).toFixed(1)} s` : `${totalSeconds} s`;
  const totalMinutes = Math.floor(totalSeconds / 60);
  const seconds = totalSeconds % 60;
  if (totalMinutes < 60) return seconds ? `${totalMinutes} min ${pad(seconds)} s` : `${totalMinutes} min`;
  const totalHours = Math.floor(totalMinutes / 60);
  const minutes = totalMinutes % 60;
  if (totalHours < 48) return minutes ? `${totalHours} h ${pad(minutes)} min` : `${totalHours} h`;
  const days = Math.floor(totalHours / 24);
  const hours = totalHours % 24;
  return hours ? `${days} d ${hours} h` : `${days} d`;
}

/** A deadline given in minutes, as people say it: "45 s", "4 min", "12 h". */
export function formatMinutes(minutes: number): string {
  return formatDurationMs(minutes * 60_000);
}

const pad = (n: number) => String(n).padStart(2, "0");
