import type { TriageState } from "@/db/schema";

/**
 * Where a card may go from each triage column. Nothing returns to "new": once someone has looked, the page
 * is acknowledged for good. Decisions can be reopened through "reviewing" (a later revision may change minds).
 */
export const allowedTransitions: Record<TriageState, readonly TriageState[]> = {
  new: ["acknowledged", "reviewing", "pursue", "dismissed", "expert"],
  acknowledged: ["reviewing", "pursue", "dismissed", "expert"],
  reviewing: ["pursue", "dismissed", "expert"],
  pursue: ["reviewing", "dismissed"],
  dismissed: ["reviewing"],
  expert: ["reviewing", "pursue", "dismissed"],
};

/** The three outcomes of a look at a candidate; entering one stamps decidedAt. */
export const decisionStates: readonly TriageState[] = ["pursue", "dismissed", "expert"];

/** Column labels of the board, in board order. */
export const triageLabels: Record<TriageState, string> = {
  new: "Incoming",
  acknowledged: "Taken",
  reviewing: "In review",
  pursue: "Pursue",
  dismissed: "Dismissed",
  expert: "Expert look",
};

/** A one-line hint under each column heading. */
export const triageHints: Record<TriageState, string> = {
  new: "Nobody has acknowledged it yet",
  acknowledged: "Acknowledged; someone has it",
  reviewing: "Being checked",
  pursue: "Go for follow-up",
  dismissed: "Not worth follow-up",
  expert: "Needs an expert look",
};

export function canTransition(from: TriageState, to: TriageState): boolean {
  return allowedTransitions[from].includes(to);
}

export function isDecision(state: TriageState): boolean {
  return decisionStates.includes(state);
}

/** Leaving "new" by any route is the acknowledgement that stops the paging escalation. */
export function acknowledges(from: TriageState, to: TriageState): boolean {
  return from === "new" && to !== "new";
}

export function requiresReason(to: TriageState): boolean {
  return to === "dismissed";
}

/** board: a drag; menu: the card menu; card: the card's own Acknowledge button; email/push: a one-click link. */
export type TriageVia = "board" | "menu" | "card" | "email" | "push" | "api";
