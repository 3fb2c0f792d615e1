/** The acknowledge page's button text (shared with the browser test that presses it). */
export const acknowledgeButtonLabel = "Acknowledge and stop escalation";
