/** Compact plot arrays for the candidate page: fitted curve and decimated samples with residuals (≤ 200 each). */
import { chirpFrequencyDerivative } from "./chirp";
import type { DerivativeTrackFit } from "./chirp-fit-derivative";
import type { TimeTrackFit } from "./chirp-fit-time";
import type { FitPlot } from "./derived-types";
import { MAX_PLOT_POINTS, compactNumber, decimatedIndices } from "./plot-points";

export function timeTrackPlot(fit: TimeTrackFit, t: readonly number[], f: readonly number[]): FitPlot {
  const { referenceFrequencyHz, amplitudePerS } = fit.model;
  const start = t[0] as number;
  const end = Math.min(t[t.length - 1] as number, fit.coalescenceTimeS);
  const curveT: number[] = [];
  const curveF: number[] = [];
  for (let k = 0; k < MAX_PLOT_POINTS; k++) {
    const tk = start + ((end - start) * k) / (MAX_PLOT_POINTS - 1);
    const remainingS = fit.coalescenceTimeS - tk;
    if (!(remainingS > 0)) continue;
    curveT.push(compactNumber(tk));
    curveF.push(compactNumber(referenceFrequencyHz * (amplitudePerS * remainingS) ** (-3 / 8)));
  }
  const indices = decimatedIndices(t.length);
  return {
    kind: "frequency-vs-time",
    curve: { tS: curveT, frequencyHz: curveF },
    samples: {
      tS: indices.map((i) => compactNumber(t[i] as number)),
      frequencyHz: indices.map((i) => compactNumber(f[i] as number)),
      residualHz: indices.map((i) => {
        const remainingS = fit.coalescenceTimeS - (t[i] as number);
        if (!(remainingS > 0)) return null;
        return compactNumber((f[i] as number) - referenceFrequencyHz * (amplitudePerS * remainingS) ** (-3 / 8));
      }),
    },
  };
}

export function derivativeTrackPlot(fit: DerivativeTrackFit, f: readonly number[], dfdt: readonly number[]): FitPlot {
  let low = Infinity;
  let high = 0;
  for (const value of f) {
    low = Math.min(low, value);
    high = Math.max(high, value);
  }
  const curveF: number[] = [];
  const curveD: number[] = [];
  const points = high > low ? MAX_PLOT_POINTS : 1;
  for (let k = 0; k < points; k++) {
    const fk = points === 1 ? low : low * (high / low) ** (k / (points - 1));
    curveF.push(compactNumber(fk));
    curveD.push(compactNumber(chirpFrequencyDerivative(fit.chirpMassDetectorFrame, fk)));
  }
  const indices = decimatedIndices(f.length);
  return {
    kind: "derivative-vs-frequency",
    curve: { frequencyHz: curveF, dfdtHzPerS: curveD },
    samples: {
      frequencyHz: indices.map((i) => compactNumber(f[i] as number)),
      dfdtHzPerS: indices.map((i) => compactNumber(dfdt[i] as number)),
      residualFraction: indices.map((i) => compactNumber(fit.residualsFraction[i] as number)),
    },
  };
}
