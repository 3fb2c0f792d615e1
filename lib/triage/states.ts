import { sourceClasses, stages, triageStates } from "@/db/schema/candidate-values";
import { taskKinds, taskStates } from "@/db/schema/task-values";

/**
 * The fixed state and kind ids under the names browser code uses, from the ORM-free value modules, so pages can
 * list them without pulling Drizzle into their scripts.
 */
export const triageStateIds = triageStates;
export const stageIds = stages;
export const sourceClassIds = sourceClasses;
export const taskKindIds = taskKinds;
export const taskStateIds = taskStates;
