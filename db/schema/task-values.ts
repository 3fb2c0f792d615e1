/** Value lists of the follow-up tasks table, with no ORM import, so browser code can use them. */
export const taskKinds = ["wide-field-tiling", "galaxy-targeted", "spectroscopy", "other"] as const;
export type TaskKind = (typeof taskKinds)[number];

export const taskStates = ["open", "claimed", "observing", "reported", "cancelled"] as const;
export type TaskState = (typeof taskStates)[number];

/** 1 is the most urgent. */
export const taskPriorities = [1, 2, 3] as const;
