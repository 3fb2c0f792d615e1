import type { TaskKind, TaskState } from "@/db/schema/tasks";

export const taskStateLabels: Record<TaskState, string> = {
  open: "Open",
  claimed: "Claimed",
  observing: "Observing",
  reported: "Reported",
  cancelled: "Cancelled",
};

export const taskStateHints: Record<TaskState, string> = {
  open: "Waiting for an observer",
  claimed: "An observer has it",
  observing: "On the sky now",
  reported: "Result in",
  cancelled: "Called off",
};

export const taskKindLabels: Record<TaskKind, string> = {
  "wide-field-tiling": "Wide-field tiling",
  "galaxy-targeted": "Galaxy-targeted imaging",
  spectroscopy: "Spectroscopy",
  other: "Other",
};

export const priorityLabels: Record<number, string> = { 1: "P1 urgent", 2: "P2 normal", 3: "P3 when possible" };

/** Where a task may go from each column; reported and cancelled are final. */
export const allowedTaskMoves: Record<TaskState, readonly TaskState[]> = {
  open: ["claimed", "cancelled"],
  claimed: ["open", "observing", "reported", "cancelled"],
  observing: ["reported", "cancelled"],
  reported: [],
  cancelled: [],
};

export function canMoveTask(from: TaskState, to: TaskState): boolean {
  return allowedTaskMoves[from].includes(to);
}

/** Tasks still in play; a withdrawal or a cancellation ends them. */
export const liveTaskStates: readonly TaskState[] = ["open", "claimed", "observing"];
