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

const pad = (n: number) => String(n).padStart(2, "0");

/** A short axis label: "45 s", "3.8 min", "2.5 h", "4 d" (one decimal at most). */
export function formatDurationAxis(ms: number): string {
  const one = (x: number) => String(Number(x.toFixed(1)));
  const abs = Math.abs(ms);
  if (abs < 60_000) return `${one(ms / 1000)} s`;
  if (abs < 3_600_000) return `${one(ms / 60_000)} min`;
  if (abs < 48 * 3_600_000) return `${one(ms / 3_600_000)} h`;
  return `${one(ms / 86_400_000)} d`;
}

/** Steps people count in: seconds, minutes, hours, days. */
const tickSteps = [1, 2, 5, 10, 15, 30, 60, 120, 300, 600, 900, 1800, 3600, 7200, 10800, 21600, 43200, 86400, 172800, 604800].map(
  (s) => s * 1000,
);

/** Round axis ticks for durations up to `maxMs` (about five, on a step people count in), starting at 0. */
export function niceDurationTicks(maxMs: number, target = 5): number[] {
  if (!(maxMs > 0)) return [0];
  const step = tickSteps.find((s) => maxMs / s <= target) ?? Math.ceil(maxMs / target / 604_800_000) * 604_800_000;
  const ticks: number[] = [];
  for (let t = 0; t < maxMs + step; t += step) ticks.push(t);
  return ticks;
}
