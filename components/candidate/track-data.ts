import type { FitPlot } from "@/lib/physics/derived-types";

export interface TrackSeries {
  kind: "frequency-vs-time";
  xLabel: string;
  yLabel: string;
  residualLabel: string;
  samples: Array<{ x: number; y: number }>;
  curve: Array<{ x: number; y: number }>;
  residuals: Array<{ x: number; r: number }>;
}

const MAX_POINTS = 400;

function decimate<T>(items: T[], limit = MAX_POINTS): T[] {
  if (items.length <= limit) return items;
  const step = items.length / limit;
  return Array.from({ length: limit }, (_, i) => items[Math.floor(i * step)] as T);
}

function numbers(value: unknown): number[] {
  return Array.isArray(value) ? value.filter((v): v is number => typeof v === "number" && Number.isFinite(v)) : [];
}

/**
 * Plot series for the frequency track: the revision payload's track as measured, the fitted chirp curve and the
 * residuals from the derived fit arrays. Plain data so the (lazily loaded) chart only draws.
 */
export function trackSeries(plot: FitPlot | null | undefined, payloadTrack: unknown): TrackSeries | null {
  const track = (payloadTrack ?? {}) as Record<string, unknown>;
  if (plot?.kind === "frequency-vs-time" || (!plot && Array.isArray(track.t))) {
    const t = numbers(track.t);
    const f = numbers(track.f);
    const measured = t.length && t.length === f.length ? t.map((x, i) => ({ x, y: f[i] as number })) : [];
    const fromPlot = plot?.kind === "frequency-vs-time" ? plot : null;
    return {
      kind: "frequency-vs-time",
      xLabel: "Time from event time (s)",
      yLabel: "Frequency (Hz)",
      residualLabel: "Residual (Hz)",
      samples: decimate(measured.length ? measured : (fromPlot?.samples.tS.map((x, i) => ({ x, y: fromPlot.samples.frequencyHz[i] ?? 0 })) ?? [])),
      curve: fromPlot ? fromPlot.curve.tS.map((x, i) => ({ x, y: fromPlot.curve.frequencyHz[i] ?? 0 })) : [],
      residuals: fromPlot
        ? fromPlot.samples.tS.flatMap((x, i) => {
            const r = fromPlot.samples.residualHz[i];
            return typeof r === "number" ? [{ x, r }] : [];
          })
        : [],
    };
  }
  return null;
}
