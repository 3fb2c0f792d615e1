/** Value lists of the candidates tables, with no ORM import, so browser code can use them. */
export const stages = ["early-warning", "first-look", "confirmed", "revised", "withdrawn"] as const;
export type Stage = (typeof stages)[number];

/** Triage columns of the board, in board order. */
export const triageStates = ["new", "acknowledged", "reviewing", "pursue", "dismissed", "expert"] as const;
export type TriageState = (typeof triageStates)[number];

export const sourceClasses = ["bns", "nsbh", "bbh", "lowerGap"] as const;
export type SourceClass = (typeof sourceClasses)[number];
