import type { SettingValue } from "@/lib/data/settings";

/**
 * The response chain, in order; each of the first six runs from the end of the one before. The last three all run
 * from the merger: how long until the first exposure, and until 50 % and 90 % of the probability was observed.
 */
export const stepIds = ["feed", "page", "acknowledge", "decide", "claim", "report", "exposure", "covered50", "covered90"] as const;
export type StepId = (typeof stepIds)[number];

export interface StepInfo {
  id: StepId;
  label: string;
  /** what starts and ends the step, for headings and tooltips */
  span: string;
}

export const steps: Record<StepId, StepInfo> = {
  feed: { id: "feed", label: "Feed latency", span: "merger → receipt" },
  page: { id: "page", label: "Paging", span: "receipt → first page sent" },
  acknowledge: { id: "acknowledge", label: "Acknowledgement", span: "first page → acknowledged; due from receipt" },
  decide: { id: "decide", label: "Triage decision", span: "acknowledged → pursue / dismiss / expert" },
  claim: { id: "claim", label: "Follow-up claim", span: "pursue decision → first task claimed" },
  report: { id: "report", label: "First report", span: "first claim → first report" },
  exposure: { id: "exposure", label: "First exposure", span: "merger → first exposure" },
  covered50: { id: "covered50", label: "Half the sky", span: "merger → 50 % of the probability observed" },
  covered90: { id: "covered90", label: "Most of the sky", span: "merger → 90 % of the probability observed" },
};

export type DeadlineSettings = SettingValue<"deadlines">;

/** Each step's deadline, in milliseconds of that step's own duration. */
export function stepDeadlinesMs(d: DeadlineSettings): Record<StepId, number> {
  const ms = (minutes: number) => Math.round(minutes * 60_000);
  return {
    feed: ms(d.feedLatencyMinutes),
    page: ms(d.pageMinutes),
    acknowledge: ms(d.acknowledgeStepMinutes),
    decide: ms(d.decisionMinutes),
    claim: ms(d.claimMinutes),
    report: ms(d.reportMinutes),
    exposure: ms(d.firstExposureMinutes),
    covered50: ms(d.covered50Minutes),
    covered90: ms(d.covered90Minutes),
  };
}
