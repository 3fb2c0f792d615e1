/**
 * Plain-language state of the chirp fit for the card and the candidate page, read from the stored derived JSON
 * (chirpMassError is "<reason code>: <detail>", see lib/physics/result.ts). Pure: no React, no SQL.
 */

export type ChirpModel = "pn-3.5" | "leading-order";

export type ChirpStatus =
  /** a chirp mass was fitted; `poorFit` says why it deserves less trust (null when the fit is good) */
  | { kind: "fitted"; model: ChirpModel | null; poorFit: string | null }
  /** the track was read but does not look like an inspiral chirp: no chirp mass */
  | { kind: "not-chirp-like"; detail: string }
  /** the track could not be used at all (empty, one sample, zero or negative frequency, milliseconds …) */
  | { kind: "unusable"; detail: string }
  /** no track was sent, or something other than the track stopped the fit */
  | { kind: "not-fitted"; detail: string };

/** Reduced χ² above which the fit's errors were scaled up (lib/physics/derive-track.ts warns from the same value). */
export const POOR_FIT_REDUCED_CHI_SQUARE = 3;

const unusableCodes = new Set([
  "length-mismatch",
  "too-few-samples",
  "non-finite-value",
  "non-positive-frequency",
  "non-positive-uncertainty",
  "times-not-increasing",
  "track-implausible",
  "non-physical-slope",
  "degenerate-fit",
]);

export const modelLabels: Record<ChirpModel, string> = {
  "pn-3.5": "3.5PN frequency evolution",
  "leading-order": "leading-order chirp",
};

function split(error: string): { code: string; detail: string } {
  const at = error.indexOf(":");
  return at < 0 ? { code: error, detail: "" } : { code: error.slice(0, at).trim(), detail: error.slice(at + 1).trim() };
}

export function chirpStatus(input: {
  fitted: boolean;
  chirpMassError: string | null | undefined;
  model: string | null | undefined;
  reducedChiSquare: number | null | undefined;
}): ChirpStatus {
  if (input.fitted) {
    const model = input.model === "pn-3.5" || input.model === "leading-order" ? input.model : null;
    const chi = input.reducedChiSquare;
    const poorFit =
      typeof chi === "number" && chi > POOR_FIT_REDUCED_CHI_SQUARE
        ? `poor fit: residuals ${chi.toFixed(1)}× the expected scatter (reduced χ²), errors scaled up`
        : null;
    return { kind: "fitted", model, poorFit };
  }
  const { code, detail } = split(input.chirpMassError ?? "");
  if (code === "missing-input" && detail === "no frequency track") return { kind: "not-fitted", detail: "the trigger carried no frequency track" };
  if (code === "track-not-chirp-like" || code === "frequency-not-rising") return { kind: "not-chirp-like", detail };
  if (unusableCodes.has(code) || (code === "missing-input" && detail.startsWith("track needs"))) return { kind: "unusable", detail: detail || code };
  return { kind: "not-fitted", detail: input.chirpMassError ? `${code}${detail ? `: ${detail}` : ""}` : "no reason stored" };
}

/** One short line for the card (the page adds the detail). */
export function chirpStatusShort(status: ChirpStatus): string {
  switch (status.kind) {
    case "fitted":
      return status.poorFit ? "poor fit" : status.model ? modelLabels[status.model] : "fitted";
    case "not-chirp-like":
      return "track not chirp-like: no chirp mass";
    case "unusable":
      return "track unusable: no chirp mass";
    case "not-fitted":
      return "not fitted";
  }
}

/** A full sentence for the candidate page. */
export function chirpStatusSentence(status: ChirpStatus): string | null {
  switch (status.kind) {
    case "fitted":
      return status.poorFit ? `Treat the chirp mass with care — ${status.poorFit}.` : null;
    case "not-chirp-like":
      return `The frequency track does not look like an inspiral chirp, so no chirp mass or merger time is given (${status.detail}).`;
    case "unusable":
      return `The frequency track was unusable, so no chirp mass or merger time is given (${status.detail}).`;
    case "not-fitted":
      return `No chirp mass: ${status.detail}.`;
  }
}
