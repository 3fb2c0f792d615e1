import type { Candidate } from "@/db/schema";

const classLabels: Record<string, string> = { bns: "BNS", nsbh: "NSBH", bbh: "BBH", lowerGap: "lower mass gap" };

/** False alarms per year in words a pager can carry: "1 per 3.2 yr" or "4.5 per yr". */
export function formatFalseAlarmRate(perYear: number): string {
  if (!(perYear > 0)) return "no false alarms expected";
  if (perYear < 1) return `1 per ${formatNumber(1 / perYear)} yr`;
  return `${formatNumber(perYear)} per yr`;
}

function formatNumber(x: number): string {
  if (x >= 1e4) return x.toExponential(1).replace("e+", "e");
  return x >= 100 ? x.toFixed(0) : x >= 10 ? x.toFixed(1) : x.toPrecision(2);
}

export type CandidateSummary = Pick<
  Candidate,
  "id" | "externalId" | "source" | "stage" | "networkSnr" | "falseAlarmRatePerYear" | "dominantClass" | "detectors"
> &
  Partial<Pick<Candidate, "chirpMassDetectorFrame">> & {
    /** reported luminosity distance of the current revision, when the pipeline sent one */
    distanceMpc?: { mean: number; sd: number } | null;
    /** 90 % credible area of the newest sky map, when one is attached */
    area90Deg2?: number | null;
  };

export interface MessageText {
  title: string;
  body: string;
}

/**
 * One line of facts, the same in push, e-mail and the app: stage, SNR, FAR, class, then the chirp mass (detector
 * frame), distance and 90 % sky area when known, and the detectors. Rapid triage estimates, said so once.
 */
export function candidateFacts(c: CandidateSummary): string {
  const cls = c.dominantClass ? `likely ${classLabels[c.dominantClass] ?? c.dominantClass}` : "class pending";
  const extras: string[] = [];
  if (typeof c.chirpMassDetectorFrame === "number") extras.push(`chirp mass ${formatNumber(c.chirpMassDetectorFrame)} M☉ (detector frame)`);
  if (c.distanceMpc) extras.push(`distance ${Math.round(c.distanceMpc.mean)} ± ${Math.round(c.distanceMpc.sd)} Mpc`);
  if (typeof c.area90Deg2 === "number") extras.push(`90 % sky area ${Math.round(c.area90Deg2).toLocaleString("en-US")} deg²`);
  const estimates = extras.length > 0 ? ` (rapid estimates: ${extras.join(", ")})` : "";
  return `${c.stage}, SNR ${c.networkSnr.toFixed(1)}, FAR ${formatFalseAlarmRate(c.falseAlarmRatePerYear)}, ${cls}${estimates}, seen by ${c.detectors.join(" ")}`;
}

export type TextOccasion =
  | { kind: "page"; role: string }
  | { kind: "escalation"; role: string; minutesUnacknowledged: number }
  | { kind: "notice"; reason: string };

/** Title and body of a message about a candidate, the same in push, e-mail and the app. */
export function candidateTextFor(c: CandidateSummary, occasion: TextOccasion): MessageText {
  const facts = candidateFacts(c);
  if (occasion.kind === "page") {
    return { title: `New candidate ${c.externalId}`, body: `${facts}. You are paged as ${occasion.role}; acknowledge to stop escalation.` };
  }
  if (occasion.kind === "escalation") {
    const minutes = occasion.minutesUnacknowledged < 1 ? "<1" : String(Math.round(occasion.minutesUnacknowledged));
    return {
      title: `Unacknowledged for ${minutes} min: ${c.externalId}`,
      body: `${facts}. Nobody has acknowledged it; you are paged as ${occasion.role}.`,
    };
  }
  return { title: `Candidate ${c.externalId} (not paged: ${occasion.reason})`, body: `${facts}.` };
}
