import type { CandidateDetail } from "@/lib/data/candidate-detail";
import { formatFalseAlarmRate, formatFalseAlarmRateExact } from "@/lib/format/far";
import { formatDuration } from "@/lib/format/duration";
import { formatPercent } from "@/lib/format/numbers";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { formatWithUncertainty, SOLAR_MASS_UNIT, trimmedPrecision } from "@/lib/format/uncertainty";
import type { Derived } from "@/lib/physics/derived-types";

interface Row {
  label: string;
  value: React.ReactNode;
  /** the frame or basis the number is in */
  note?: string;
}

function Missing({ why }: { why: string | null | undefined }) {
  return <span className="text-muted">not computed{why ? `: ${why}` : ""}</span>;
}

/** The headline numbers with uncertainties, units and the frame each is in. */
export function KeyNumbers({ detail, derived, timeZone }: { detail: CandidateDetail; derived: Partial<Derived>; timeZone: string }) {
  const cm = derived.chirpMass;
  const z = derived.redshift;
  const rows: Row[] = [
    {
      label: "Chirp mass",
      note: "detector frame",
      value: cm ? formatWithUncertainty(cm.detectorFrame.value, cm.detectorFrame.sd, SOLAR_MASS_UNIT) : <Missing why={derived.chirpMassError} />,
    },
    {
      label: "Chirp mass",
      note: derived.redshiftAssumed ? "source frame, z = 0 assumed (no distance given)" : "source frame, ÷ (1 + z)",
      value: cm?.sourceFrame ? formatWithUncertainty(cm.sourceFrame.value, cm.sourceFrame.sd, SOLAR_MASS_UNIT) : <Missing why={cm?.sourceFrameError ?? derived.chirpMassError} />,
    },
    {
      label: "Redshift",
      note: derived.redshiftAssumed ? "assumed" : "from the feed's distance, Planck 2018 cosmology",
      value: z ? formatWithUncertainty(z.value, z.sd) : <Missing why={derived.redshiftError} />,
    },
    {
      label: "Merger",
      note: "coalescence time after the feed's event time",
      value:
        derived.coalescenceTime === null || derived.coalescenceTime === undefined ? (
          <Missing why={derived.coalescenceTimeError} />
        ) : (
          formatWithUncertainty(derived.coalescenceTime, derived.coalescenceTimeSd ?? null, "s")
        ),
    },
    {
      label: "Time to merger at receipt",
      value:
        derived.secondsToMerger === null || derived.secondsToMerger === undefined ? (
          <Missing why={derived.secondsToMergerError} />
        ) : derived.secondsToMerger > 0 ? (
          `${formatDuration(derived.secondsToMerger)} before merger`
        ) : (
          `${formatDuration(-derived.secondsToMerger)} after merger`
        ),
    },
    {
      label: "P(neutron star)",
      note: "at least one component",
      value: derived.pNeutronStar === null || derived.pNeutronStar === undefined ? <Missing why={derived.pNeutronStarError} /> : formatPercent(derived.pNeutronStar),
    },
    {
      label: "P(remnant matter)",
      note: "matter left outside the final black hole",
      value: derived.pRemnantMatter === null || derived.pRemnantMatter === undefined ? <Missing why={derived.pRemnantMatterError} /> : formatPercent(derived.pRemnantMatter),
    },
    { label: "Network SNR", value: detail.headline.networkSnr.toFixed(1) },
    {
      label: "False-alarm rate",
      value: (
        <span title={formatFalseAlarmRateExact(detail.headline.falseAlarmRatePerYear)}>
          {formatFalseAlarmRate(detail.headline.falseAlarmRatePerYear)} <span className="text-faint">({formatFalseAlarmRateExact(detail.headline.falseAlarmRatePerYear)})</span>
        </span>
      ),
    },
    { label: "Detectors", value: <span className="font-mono">{detail.headline.detectors.join(" ")}</span> },
    { label: "Event time", note: "the feed's merger estimate", value: <time dateTime={isoUtc(detail.state.eventTime)} title={isoUtc(detail.state.eventTime)}>{formatInZone(detail.state.eventTime, timeZone)}</time> },
    { label: "Received", value: <time dateTime={isoUtc(detail.state.receivedAt)} title={isoUtc(detail.state.receivedAt)}>{formatInZone(detail.state.receivedAt, timeZone)}</time> },
  ];
  const fit = derived.fit;
  return (
    <div className="space-y-3">
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
        {rows.map((row, i) => (
          <div key={`${row.label}-${i}`} className="min-w-0">
            <dt className="text-xs text-muted">
              {row.label}
              {row.note ? <span className="text-faint"> · {row.note}</span> : null}
            </dt>
            <dd className="font-mono text-sm tabular-nums">{row.value}</dd>
          </div>
        ))}
      </dl>
      {fit ? (
        <p className="text-xs text-muted">
          Fit: {fit.samplesUsed} samples, {fit.frequencyMinHz.toFixed(0)}–{fit.frequencyMaxHz.toFixed(0)} Hz
          {fit.residualRms !== null ? `, RMS residual ${trimmedPrecision(fit.residualRms, 3)} ${fit.residualRmsUnit === "Hz" ? "Hz" : "(fraction of df/dt)"}` : ""}
          {fit.reducedChiSquare !== null ? `, reduced χ² ${fit.reducedChiSquare.toFixed(2)}` : ""}.
          {fit.warnings.length ? ` Warnings: ${fit.warnings.join("; ")}` : ""}
        </p>
      ) : (
        <p className="text-xs text-muted">Fit: {derived.fitError ?? "not available"}</p>
      )}
    </div>
  );
}

/** Merger and ringdown frequencies with the masses they come from, detector frame (what the detectors see). */
export function MergerFrequencyTable({ derived }: { derived: Partial<Derived> }) {
  const m = derived.mergerFrequency;
  if (!m) return <p className="text-sm text-muted">Not computed{derived.mergerFrequencyError ? `: ${derived.mergerFrequencyError}` : "."}</p>;
  const hz = (v: number | null) => (v === null ? "—" : `${trimmedPrecision(v, 4)} Hz`);
  const mass = (v: { detectorFrame: number; sourceFrame: number | null }) =>
    `${trimmedPrecision(v.detectorFrame, 4)} ${SOLAR_MASS_UNIT} det.${v.sourceFrame === null ? "" : ` · ${trimmedPrecision(v.sourceFrame, 4)} src.`}`;
  const rows: Array<[string, string]> = [
    ["ISCO, total mass (Schwarzschild)", hz(m.iscoHz)],
    ["ISCO, remnant (Kerr)", hz(m.iscoKerrHz)],
    ["Ringdown (l = m = 2, n = 0)", m.ringdownHz === null ? `— ${m.ringdownError ?? ""}` : hz(m.ringdownHz)],
    ["Ringdown damping time", m.ringdownDampingTimeS === null ? "—" : `${trimmedPrecision(m.ringdownDampingTimeS * 1000, 3)} ms`],
    ["Total mass", mass(m.totalMass)],
    ["Final mass", mass(m.finalMass)],
    ["Final spin", m.finalSpin.toFixed(3)],
    ["Energy radiated", formatPercent(m.radiatedEnergyFraction)],
  ];
  return (
    <div className="space-y-2">
      <dl className="space-y-1 text-sm">
        {rows.map(([label, value]) => (
          <div key={label} className="flex justify-between gap-3">
            <dt className="text-muted">{label}</dt>
            <dd className="text-right font-mono tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      <p className="text-xs text-faint">Detector frame{m.spinsAssumed ? "; spins not given, zero assumed" : ""}.</p>
    </div>
  );
}
