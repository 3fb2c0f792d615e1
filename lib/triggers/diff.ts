/**
 * How one trigger's numbers differ from the preferred trigger's, for the candidate page's triggers table. Pure.
 * A false-alarm rate differs by a factor (rates span decades), the others by a difference in their own unit.
 */
export interface TriggerNumbers {
  eventTimeMs: number;
  networkSnr: number;
  falseAlarmRatePerYear: number;
  chirpMassDetectorFrame: number | null;
  detectors: string[];
}

export interface TriggerDiff {
  /** this trigger's event time minus the preferred one's */
  eventTimeOffsetMs: number;
  networkSnrDelta: number;
  /** this trigger's false-alarm rate over the preferred one's (null when the preferred rate is 0) */
  falseAlarmRateRatio: number | null;
  /** detector-frame chirp mass difference, M☉ (null when either was not fitted) */
  chirpMassDetectorFrameDelta: number | null;
  /** detectors this trigger has and the preferred lacks, and the other way round */
  detectorsOnlyHere: string[];
  detectorsMissingHere: string[];
}

export function diffAgainstPreferred(t: TriggerNumbers, preferred: TriggerNumbers): TriggerDiff {
  const mine = new Set(t.detectors);
  const theirs = new Set(preferred.detectors);
  return {
    eventTimeOffsetMs: t.eventTimeMs - preferred.eventTimeMs,
    networkSnrDelta: t.networkSnr - preferred.networkSnr,
    falseAlarmRateRatio: preferred.falseAlarmRatePerYear > 0 ? t.falseAlarmRatePerYear / preferred.falseAlarmRatePerYear : null,
    chirpMassDetectorFrameDelta:
      t.chirpMassDetectorFrame === null || preferred.chirpMassDetectorFrame === null ? null : t.chirpMassDetectorFrame - preferred.chirpMassDetectorFrame,
    detectorsOnlyHere: t.detectors.filter((d) => !theirs.has(d)),
    detectorsMissingHere: preferred.detectors.filter((d) => !mine.has(d)),
  };
}

/** Signed text of a difference: "+0.25", "−1.3", "0" (a true minus sign). */
export function signed(value: number, digits: number): string {
  const text = Math.abs(value).toFixed(digits);
  if (Number(text) === 0) return "0";
  return `${value > 0 ? "+" : "−"}${text}`;
}
