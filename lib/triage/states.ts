import type { SourceClass, Stage, TriageState } from "@/db/schema/candidates";
import type { TaskKind, TaskState } from "@/db/schema/tasks";

/**
 * The fixed state and kind ids (defined with the tables in db/schema), repeated here without the ORM so browser
 * code can list them without pulling Drizzle into the page's script. tests/boards/states.test.ts keeps the two equal.
 */
export const triageStateIds = ["new", "acknowledged", "reviewing", "pursue", "dismissed", "expert"] as const satisfies readonly TriageState[];
export const stageIds = ["early-warning", "first-look", "confirmed", "revised", "withdrawn"] as const satisfies readonly Stage[];
export const sourceClassIds = ["bns", "nsbh", "bbh", "lowerGap"] as const satisfies readonly SourceClass[];
export const taskKindIds = ["wide-field-tiling", "galaxy-targeted", "spectroscopy", "other"] as const satisfies readonly TaskKind[];
export const taskStateIds = ["open", "claimed", "observing", "reported", "cancelled"] as const satisfies readonly TaskState[];
