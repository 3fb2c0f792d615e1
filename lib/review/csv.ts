import type { CandidateReview } from "./evaluate";
import { stepIds } from "./steps";

/** RFC 4180 field: quoted when it holds a comma, quote or line break; quotes doubled. */
export function csvField(value: string | number | boolean | null): string {
  if (value === null) return "";
  let text = String(value);
  // Text that a spreadsheet would run as a formula is defused with a leading apostrophe (common practice).
  if (typeof value === "string" && /^[=+\-@\t\r]/.test(text)) text = `'${text}`;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
const seconds = (ms: number | null) => (ms === null ? null : Math.round(ms) / 1000);

export const csvHeader = [
  "candidate_id",
  "source",
  "external_id",
  "stage",
  "class",
  "triage_state",
  "merger_utc",
  "received_utc",
  ...stepIds.flatMap((s) => [`${s}_status`, `${s}_seconds`, `${s}_over_deadline`]),
];

/** The per-candidate table as CSV (CRLF line ends per RFC 4180), durations in seconds, times ISO 8601 UTC. */
export function reviewCsv(rows: readonly CandidateReview[]): string {
  const lines = [csvHeader.join(",")];
  for (const { facts, steps } of rows) {
    const cells: Array<string | number | boolean | null> = [
      facts.id,
      facts.source,
      facts.externalId,
      facts.stage,
      facts.dominantClass,
      facts.triageState,
      iso(facts.eventTimeMs),
      iso(facts.receivedAtMs),
    ];
    for (const s of stepIds) {
      const t = steps[s];
      cells.push(t.status, seconds(t.durationMs), t.status === "done" || t.status === "open" ? t.overDeadline : null);
    }
    lines.push(cells.map(csvField).join(","));
  }
  return `${lines.join("\r\n")}\r\n`;
}
