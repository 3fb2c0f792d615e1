import { formatInZone } from "@/lib/format/time";
import { triageLabels } from "@/lib/triage/transitions";
import type { AckLinkState } from "./acknowledge";

/** The acknowledge page's button text (shared with the browser test that presses it). */
export const acknowledgeButtonLabel = "Acknowledge and stop escalation";

/**
 * What the acknowledge page says once the candidate is acknowledged: "Acknowledged by Ada Quill at …. Escalation
 * stopped." to the person who just pressed, "Already acknowledged by …" to anyone else, plus where the candidate
 * has gone since, by its column name.
 */
export function acknowledgedText(state: Exclude<AckLinkState, { state: "refused" }>): string {
  const own = state.state === "done" && state.acknowledgedBy === state.userName;
  const by = state.acknowledgedBy ? ` by ${state.acknowledgedBy}` : "";
  const at = state.acknowledgedAt ? ` at ${formatInZone(state.acknowledgedAt, state.timeZone)}` : "";
  const triageState = state.candidate.triageState;
  const label = Object.hasOwn(triageLabels, triageState) ? triageLabels[triageState as keyof typeof triageLabels] : triageState;
  const moved = triageState !== "acknowledged" && triageState !== "new" ? ` It is now in “${label}”.` : "";
  return `${own ? "Acknowledged" : "Already acknowledged"}${by}${at}.${own ? " Escalation stopped." : ""}${moved}`;
}
