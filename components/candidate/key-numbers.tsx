import type { CandidateDetail } from "@/lib/data/candidate-detail";
import { formatFalseAlarmRate, formatFalseAlarmRateExact } from "@/lib/format/far";
import { formatDuration } from "@/lib/format/duration";
import { formatPercent } from "@/lib/format/numbers";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { formatWithUncertainty, SOLAR_MASS_UNIT } from "@/lib/format/uncertainty";
import type { Derived } from "@/lib/physics/derived-types";
import { FitSummary } from "./fit-summary";

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
      label: "Fitted merger time",
      note: "seconds after the feed's event time",
      value:
        derived.coalescenceTime === null || derived.coalescenceTime === undefined ? (
          <Missing why={derived.coalescenceTimeError} />
        ) : (
          formatWithUncertainty(derived.coalescenceTime, derived.coalescenceTimeSd ?? null, "s")
        ),
    },
    {
      label: "Receipt",
      note: "relative to the fitted merger",
      value:
        derived.secondsToMerger === null || derived.secondsToMerger === undefined ? (
          <Missing why={derived.secondsToMergerError} />
        ) : derived.secondsToMerger > 0 ? (
          `received ${formatDuration(derived.secondsToMerger)} before merger`
        ) : (
          `received ${formatDuration(-derived.secondsToMerger)} after merger`
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
    {
      label: "p-astro",
      note: "probability of astrophysical origin",
      value: derived.astroProbability ? formatPercent(derived.astroProbability.pAstro) : <Missing why={derived.astroProbabilityError} />,
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
    { label: "Event time", note: "the pipeline's merger time; hover for UTC", value: <time dateTime={isoUtc(detail.state.eventTime)} title={isoUtc(detail.state.eventTime)}>{formatInZone(detail.state.eventTime, timeZone)}</time> },
    { label: "Received", note: "by Chirpdesk; hover for UTC", value: <time dateTime={isoUtc(detail.state.receivedAt)} title={isoUtc(detail.state.receivedAt)}>{formatInZone(detail.state.receivedAt, timeZone)}</time> },
  ];
  return (
    <div className="space-y-3">
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-2">
        {rows.map((row, i) => (
          <div key={`${row.label}-${i}`} className="min-w-0">
            <dt className="text-xs text-muted">
              {row.label}
              {row.note ? <span className="text-faint"> · {row.note}</span> : null}
            </dt>
            <dd className="break-words font-mono text-sm tabular-nums">{row.value}</dd>
          </div>
        ))}
      </dl>
      <FitSummary derived={derived} />
    </div>
  );
}
