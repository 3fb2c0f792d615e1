/** Compact plot arrays for the candidate page: fitted curve and decimated samples with residuals (≤ 200 each). */
import type { FitPlot } from "./derived-types";
import { MAX_PLOT_POINTS, compactNumber, decimatedIndices } from "./plot-points";

/** Fitted curve f(t) (`frequencyAt`, NaN at or after t_c) and decimated samples with residuals. */
export function timeTrackPlot(coalescenceTimeS: number, t: readonly number[], f: readonly number[], frequencyAt: (tS: number) => number): FitPlot {
  const start = t[0] as number;
  const end = Math.min(t[t.length - 1] as number, coalescenceTimeS);
  const curveT: number[] = [];
  const curveF: number[] = [];
  for (let k = 0; k < MAX_PLOT_POINTS; k++) {
    const tk = start + ((end - start) * k) / (MAX_PLOT_POINTS - 1);
    const model = frequencyAt(tk);
    if (!Number.isFinite(model)) continue;
    curveT.push(compactNumber(tk));
    curveF.push(compactNumber(model));
  }
  const indices = decimatedIndices(t.length);
  return {
    kind: "frequency-vs-time",
    curve: { tS: curveT, frequencyHz: curveF },
    samples: {
      tS: indices.map((i) => compactNumber(t[i] as number)),
      frequencyHz: indices.map((i) => compactNumber(f[i] as number)),
      residualHz: indices.map((i) => {
        const model = frequencyAt(t[i] as number);
        return Number.isFinite(model) ? compactNumber((f[i] as number) - model) : null;
      }),
    },
  };
}
