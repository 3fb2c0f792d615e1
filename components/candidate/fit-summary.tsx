import { chirpStatus, chirpStatusSentence, modelLabels } from "@/lib/format/chirp-status";
import { trimmedPrecision } from "@/lib/format/uncertainty";
import type { Derived } from "@/lib/physics/derived-types";

/** Which model produced the chirp mass, how well it fitted, and in plain words why there is none when there is none. */
export function FitSummary({ derived }: { derived: Partial<Derived> }) {
  const fit = derived.fit ?? null;
  const status = chirpStatus({
    fitted: Boolean(derived.chirpMass),
    chirpMassError: derived.chirpMassError,
    model: fit?.model,
    reducedChiSquare: fit?.reducedChiSquare,
  });
  const sentence = chirpStatusSentence(status);
  const alarming = status.kind === "unusable" || status.kind === "not-chirp-like" || (status.kind === "fitted" && status.poorFit);
  return (
    <div className="space-y-1.5" data-testid="fit-summary">
      {sentence ? (
        <p role={alarming ? "alert" : undefined} data-status={status.kind} className={alarming ? "rounded-md border border-warn/50 bg-warn/10 px-2 py-1 text-sm" : "text-sm text-muted"}>
          {sentence}
        </p>
      ) : null}
      {fit ? (
        <p className="text-xs text-muted">
          Model: <strong className="font-medium text-fg">{modelLabels[fit.model] ?? fit.model}</strong>
          {fit.massRatio ? ` (η = ${fit.massRatio.eta.toFixed(3)} ± ${fit.massRatio.etaSd.toFixed(3)} from the trigger's masses)` : ""}. {fit.samplesUsed} samples,{" "}
          {fit.frequencyMinHz.toFixed(0)}–{fit.frequencyMaxHz.toFixed(0)}&nbsp;Hz
          {fit.residualRms !== null ? `, RMS residual ${trimmedPrecision(fit.residualRms, 3)}\u00a0Hz` : ""}
          {fit.reducedChiSquare !== null ? `, reduced χ² ${fit.reducedChiSquare.toFixed(2)}` : ""}.
          {fit.warnings.length ? ` Warnings: ${fit.warnings.join("; ")}` : ""}
        </p>
      ) : status.kind === "not-fitted" ? null : (
        <p className="text-xs text-muted">Fit: {derived.fitError ?? "not available"}</p>
      )}
    </div>
  );
}
