import { formatPercent } from "@/lib/format/numbers";
import { formatWithUncertainty, SOLAR_MASS_UNIT, trimmedPrecision } from "@/lib/format/uncertainty";
import type { Derived } from "@/lib/physics/derived-types";

const hz = (v: number | null, sd: number | null | undefined) => (v === null ? "—" : formatWithUncertainty(v, sd ?? null, "Hz"));

/**
 * Merger and ringdown frequencies with their 1σ spreads from the component-mass sds (detector frame, what the
 * detectors see), the neutron-star caveat where one applies, and the remnant-matter fraction with its assumptions.
 */
export function MergerPanel({ derived }: { derived: Partial<Derived> }) {
  const m = derived.mergerFrequency;
  if (!m) return <p className="text-sm text-muted">Not computed{derived.mergerFrequencyError ? `: ${derived.mergerFrequencyError}` : "."}</p>;
  const sd = m.sd ?? null;
  const mass = (v: { detectorFrame: number; sourceFrame: number | null }, spread?: number) =>
    `${formatWithUncertainty(v.detectorFrame, spread ?? null, SOLAR_MASS_UNIT)} det.${v.sourceFrame === null ? "" : ` · ${trimmedPrecision(v.sourceFrame, 4)} src.`}`;
  const damping = m.ringdownDampingTimeS === null ? "—" : formatWithUncertainty(m.ringdownDampingTimeS * 1000, sd?.ringdownDampingTimeS == null ? null : sd.ringdownDampingTimeS * 1000, "ms");
  const rows: Array<[string, string]> = [
    ["ISCO, total mass (Schwarzschild)", hz(m.iscoHz, sd?.iscoHz)],
    [`ISCO, remnant (Kerr, ${m.finalSpin < 0 ? "retrograde" : "prograde"})`, hz(m.iscoKerrHz, sd?.iscoKerrHz)],
    ["Ringdown (l = m = 2, n = 0)", m.ringdownHz === null ? `— ${m.ringdownError ?? ""}` : hz(m.ringdownHz, sd?.ringdownHz)],
    ["Ringdown damping time", damping],
    ["Total mass", mass(m.totalMass)],
    ["Final mass", mass(m.finalMass, sd?.finalMassDetectorFrame)],
    ["Final spin", formatWithUncertainty(m.finalSpin, sd?.finalSpin ?? null)],
    ["Energy radiated", formatPercent(m.radiatedEnergyFraction)],
  ];
  const rem = derived.remnantMatter ?? null;
  return (
    <div className="space-y-2" data-testid="merger-panel">
      {m.remnantNote ? (
        <p role="note" className="rounded-md border border-warn/40 bg-warn/10 px-2 py-1 text-xs">
          Neutron stars involved: {m.remnantNote}.
        </p>
      ) : (derived.pNeutronStar ?? 0) >= 0.5 ? (
        <p role="note" className="rounded-md border border-warn/40 bg-warn/10 px-2 py-1 text-xs">
          A neutron star is likely involved ({formatPercent(derived.pNeutronStar ?? 0)}): these are black-hole fits; tides and disruption change the merger and may weaken the ringdown.
        </p>
      ) : null}
      <dl className="space-y-1 text-sm">
        {rows.map(([label, value]) => (
          <div key={label} className="flex flex-wrap justify-between gap-x-3">
            <dt className="min-w-0 text-muted">{label}</dt>
            <dd className="ml-auto text-right font-mono tabular-nums">{value}</dd>
          </div>
        ))}
      </dl>
      <p className="text-xs text-faint">
        Detector frame; ± from the component-mass uncertainties (spins held fixed){m.spinsAssumed ? "; spins not given, zero assumed" : ""}.
      </p>
      <div className="border-t border-line pt-2 text-sm" data-testid="remnant-matter">
        <span className="text-muted">Matter left outside the black hole: </span>
        {rem ? (
          <>
            <span className="font-mono tabular-nums">{formatPercent(rem.massFraction)}</span>
            <span className="text-muted"> of the neutron star&apos;s baryonic mass</span>
            <span className="block text-xs text-faint">
              Foucart, Hinderer &amp; Nissanke 2018 fit at the mean masses ({trimmedPrecision(rem.blackHoleMassSourceFrame, 3)} + {trimmedPrecision(rem.neutronStarMassSourceFrame, 3)}&nbsp;{SOLAR_MASS_UNIT} source frame), assuming a neutron-star radius of {rem.nsRadiusKm}&nbsp;km and black-hole spin {rem.blackHoleSpin.toFixed(2)}{rem.spinsAssumed ? " (spins not given, zero assumed)" : ""}.
            </span>
          </>
        ) : (
          <span className="text-muted">not computed{derived.remnantMatterError ? `: ${derived.remnantMatterError}` : ""}</span>
        )}
      </div>
    </div>
  );
}
