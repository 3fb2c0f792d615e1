import { sourceClasses, type SourceClass, type Stage } from "@/db/schema/candidates";
import type { FeedCandidate } from "@/lib/validations/feed";

/*
 * The headline columns of a candidate and its revisions: how a derived result and a feed post map onto them,
 * and how two revisions' headlines differ. Pure, and kept beside storage because storage writes and reads them.
 */

/** The numbers the physics module derived that lists sort and filter by (copied into columns). */
export interface DerivedHeadline {
  chirpMassDetectorFrame: number | null;
  chirpMassDetectorFrameSd: number | null;
  pBns: number | null;
  pNsbh: number | null;
  pBbh: number | null;
  pLowerGap: number | null;
  redshift: number | null;
  dominantClass: SourceClass | null;
}

function field(value: unknown, key: string): unknown {
  return value !== null && typeof value === "object" ? (value as Record<string, unknown>)[key] : undefined;
}

function finiteOrNull(value: unknown): number | null {
  return typeof value === "number" && Number.isFinite(value) ? value : null;
}

/**
 * Reads the headline numbers from a derived result, either freshly computed or read back from JSON.
 * A block the physics module could not compute is null, so every number here may be null.
 */
export function headlineFromDerived(derived: unknown): DerivedHeadline {
  const detectorFrame = field(field(derived, "chirpMass"), "detectorFrame");
  const classes = field(derived, "classProbabilities");
  const p = (c: SourceClass) => finiteOrNull(field(classes, c));
  let dominantClass: SourceClass | null = null;
  for (const c of sourceClasses) {
    const value = p(c);
    if (value !== null && (dominantClass === null || value > (p(dominantClass) ?? -1))) dominantClass = c;
  }
  return {
    chirpMassDetectorFrame: finiteOrNull(field(detectorFrame, "value")),
    chirpMassDetectorFrameSd: finiteOrNull(field(detectorFrame, "sd")),
    pBns: p("bns"),
    pNsbh: p("nsbh"),
    pBbh: p("bbh"),
    pLowerGap: p("lowerGap"),
    // The physics module reports redshift as { value, sd }; a bare number is accepted too.
    redshift: finiteOrNull(field(derived, "redshift")) ?? finiteOrNull(field(field(derived, "redshift"), "value")),
    dominantClass,
  };
}

/** What a revision says at a glance: what the board shows and what a change between revisions is told in. */
export interface RevisionHeadline {
  stage: Stage;
  eventTime: string;
  networkSnr: number;
  falseAlarmRatePerYear: number;
  detectors: string[];
  chirpMassDetectorFrame: number | null;
  dominantClass: SourceClass | null;
}

export interface HeadlineChange {
  field: keyof RevisionHeadline;
  from: unknown;
  to: unknown;
}

const comparedFields = [
  "stage",
  "eventTime",
  "networkSnr",
  "falseAlarmRatePerYear",
  "detectors",
  "chirpMassDetectorFrame",
  "dominantClass",
] as const satisfies ReadonlyArray<keyof RevisionHeadline>;

/** Fields that differ from one revision to the next, in a fixed order; detectors compare as sets. */
export function diffHeadlines(from: RevisionHeadline, to: RevisionHeadline): HeadlineChange[] {
  const changes: HeadlineChange[] = [];
  for (const key of comparedFields) {
    const a = from[key];
    const b = to[key];
    const same = Array.isArray(a) && Array.isArray(b) ? [...a].sort().join(",") === [...b].sort().join(",") : a === b;
    if (!same) changes.push({ field: key, from: a, to: b });
  }
  return changes;
}

export function revisionHeadline(payload: FeedCandidate, derived: DerivedHeadline): RevisionHeadline {
  return {
    stage: payload.stage,
    eventTime: new Date(payload.eventTime).toISOString(),
    networkSnr: payload.networkSnr,
    falseAlarmRatePerYear: payload.falseAlarmRatePerYear,
    detectors: payload.detectors,
    chirpMassDetectorFrame: derived.chirpMassDetectorFrame,
    dominantClass: derived.dominantClass,
  };
}
