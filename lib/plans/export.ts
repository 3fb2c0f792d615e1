import { isoInZone } from "@/lib/format/time";
import type { PlanExportFormat } from "@/lib/validations/plans";
import type { PlanRecord } from "./record";

/** Shown wherever plan numbers leave the screen: they are rapid estimates, not the final word. */
export const planCaution =
  "Rapid triage estimates from the sky map as uploaded; official parameter estimates and local observatory safety rules take precedence.";

/** Our export columns: units in the names, times both in UTC and in the site's own zone. */
export const planCsvColumns = [
  "pointing",
  "ra_deg",
  "dec_deg",
  "probability",
  "gained_probability",
  "cumulative_probability",
  "start_utc",
  "end_utc",
  "start_site_local",
  "end_site_local",
  "altitude_deg",
  "airmass",
  "moon_distance_deg",
  "exposure_s",
  "filter",
  "not_scheduled_because",
] as const;

export interface PlanExport {
  fileName: string;
  contentType: string;
  body: string;
}

const fixed = (value: number | null, digits: number) => (value === null ? "" : value.toFixed(digits));

/** RFC 4180: quote a cell holding a comma, quote or line break; double the quotes inside. */
function csvCell(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replace(/"/g, '""')}"` : value;
}

function exportRows(plan: PlanRecord) {
  const zone = plan.site?.timeZone ?? "UTC";
  const local = (iso: string | null) => (iso ? isoInZone(iso, zone) : "");
  return plan.pointings.map((p) => ({
    pointing: p.index,
    raDeg: Number(p.raDeg.toFixed(5)),
    decDeg: Number(p.decDeg.toFixed(5)),
    probability: p.probability,
    gainedProbability: p.gainedProbability,
    cumulativeProbability: p.cumulativeProbability,
    startUtc: p.plannedStart,
    endUtc: p.plannedEnd,
    startSiteLocal: local(p.plannedStart) || null,
    endSiteLocal: local(p.plannedEnd) || null,
    altitudeDeg: p.altitudeDeg,
    airmass: p.airmass,
    moonDistanceDeg: p.moonSeparationDeg,
    exposureS: plan.exposureS,
    filter: plan.filter,
    notScheduledBecause: p.unscheduledReason,
  }));
}

function csvBody(plan: PlanRecord): string {
  const lines = [planCsvColumns.join(",")];
  for (const r of exportRows(plan)) {
    const cells = [
      String(r.pointing),
      r.raDeg.toFixed(5),
      r.decDeg.toFixed(5),
      r.probability.toFixed(6),
      r.gainedProbability.toFixed(6),
      r.cumulativeProbability.toFixed(6),
      r.startUtc ?? "",
      r.endUtc ?? "",
      r.startSiteLocal ?? "",
      r.endSiteLocal ?? "",
      fixed(r.altitudeDeg, 2),
      fixed(r.airmass, 3),
      fixed(r.moonDistanceDeg, 2),
      String(r.exposureS),
      r.filter ?? "",
      r.notScheduledBecause ?? "",
    ];
    lines.push(cells.map(csvCell).join(","));
  }
  return `${lines.join("\r\n")}\r\n`;
}

function jsonBody(plan: PlanRecord): string {
  const zone = plan.site?.timeZone ?? "UTC";
  return JSON.stringify(
    {
      plan: {
        id: plan.id,
        candidateId: plan.candidateId,
        site: plan.site ? { code: plan.site.code, name: plan.site.name, timeZone: zone } : null,
        instrument: { id: plan.instrumentId, name: plan.instrumentName, footprint: plan.footprint, exposureS: plan.exposureS, overheadS: plan.overheadS, filter: plan.filter },
        skymapId: plan.skymapId,
        level: plan.level,
        window: { startUtc: plan.window.start, endUtc: plan.window.end, startSiteLocal: isoInZone(plan.window.start, zone), endSiteLocal: isoInZone(plan.window.end, zone) },
        moonDistanceDeg: plan.moonDistanceDeg,
        totalProbability: plan.totalProbability,
        scheduledProbability: plan.scheduledProbability,
        createdAt: plan.createdAt,
        caution: planCaution,
      },
      pointings: exportRows(plan),
    },
    null,
    2,
  );
}

/** The plan as a download: CSV (one row per pointing, in pointing order) or JSON (plan header plus the same rows). */
export function exportPlan(plan: PlanRecord, format: PlanExportFormat): PlanExport {
  const day = plan.window.start.slice(0, 10);
  const base = `plan-${plan.site?.code ?? "site"}-${day}-${plan.id.slice(0, 8)}`.replace(/[^A-Za-z0-9._-]/g, "_");
  return format === "csv"
    ? { fileName: `${base}.csv`, contentType: "text/csv; charset=utf-8", body: csvBody(plan) }
    : { fileName: `${base}.json`, contentType: "application/json; charset=utf-8", body: jsonBody(plan) };
}
