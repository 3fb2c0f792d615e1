import { z } from "zod";
import { taskKinds, taskStates } from "@/db/schema/task-values";

/** An instant from a form or JSON: ISO text or epoch milliseconds; empty means none. */
const optionalInstant = z
  .union([z.string(), z.number(), z.null()])
  .optional()
  .transform((value, ctx) => {
    if (value === undefined || value === null || value === "") return null;
    const date = new Date(value);
    if (Number.isNaN(date.getTime())) {
      ctx.addIssue({ code: "custom", message: "not a date and time" });
      return z.NEVER;
    }
    return date;
  });

/** The planning form's value for a task any site may take. */
export const anySite = "any";
/** How far ahead a task's window may reach: follow-up is for the coming nights, not a year from now. */
export const taskWindowMaxAheadDays = 7;
const dayMs = 86_400_000;

/** One task of the follow-up planning form. */
export const taskDraftSchema = z
  .object({
    kind: z.enum(taskKinds),
    // A site, or an explicit "any site" ("any" from the form, null from scripts); never left unchosen.
    siteId: z
      .string({ error: 'choose a site, or "any site"' })
      .trim()
      .min(1, 'choose a site, or "any site"')
      .nullable()
      .transform((v) => (v === null || v === anySite ? null : v)),
    windowStart: optionalInstant,
    windowEnd: optionalInstant,
    priority: z.coerce.number().int().min(1).max(3).default(2),
    notes: z.string().trim().max(2000).default(""),
  })
  .superRefine((task, ctx) => {
    if (task.windowStart && task.windowEnd && task.windowEnd <= task.windowStart) {
      ctx.addIssue({ code: "custom", path: ["windowEnd"], message: "the window must end after it starts" });
    }
  });
export type TaskDraftInput = z.input<typeof taskDraftSchema>;
export type TaskDraft = z.output<typeof taskDraftSchema>;

/** POST /api/v1/candidates/:id/tasks: several tasks at once. */
export const createTasksBodySchema = z.object({
  tasks: z.array(taskDraftSchema).min(1, "add at least one task").max(20),
});
export type CreateTasksBody = z.input<typeof createTasksBodySchema>;

/** Windows reaching more than `taskWindowMaxAheadDays` past `now`, as field issues (`tasks.<i>.windowEnd`). */
export function windowAheadIssues(drafts: Array<Pick<TaskDraft, "windowStart" | "windowEnd">>, now: Date): Array<{ path: string; message: string }> {
  const limitMs = now.getTime() + taskWindowMaxAheadDays * dayMs;
  const issues: Array<{ path: string; message: string }> = [];
  drafts.forEach((d, i) => {
    for (const key of ["windowStart", "windowEnd"] as const) {
      const at = d[key];
      if (at && at.getTime() > limitMs) {
        issues.push({ path: `tasks.${i}.${key}`, message: `the window must lie within the next ${taskWindowMaxAheadDays} days` });
      }
    }
  });
  return issues;
}

/** The form's schema: the body schema plus the 7-day bound against the given clock. */
export const createTasksBodySchemaAt = (now: Date) =>
  createTasksBodySchema.superRefine((body, ctx) => {
    for (const issue of windowAheadIssues(body.tasks, now)) ctx.addIssue({ code: "custom", path: issue.path.split(".").map((p) => (/^\d+$/.test(p) ? Number(p) : p)), message: issue.message });
  });

/** POST /api/v1/tasks/:id/state: moves other than claiming and reporting. */
export const taskStateBodySchema = z
  .strictObject({
    to: z.enum(["open", "observing", "cancelled"]),
    reason: z.string().trim().max(2000).optional(),
    expectedVersion: z.number().int().min(1).optional(),
  })
  .superRefine((body, ctx) => {
    if (body.to === "cancelled" && !body.reason) {
      ctx.addIssue({ code: "custom", path: ["reason"], message: "say why the task is cancelled" });
    }
  });
export type TaskStateBody = z.input<typeof taskStateBodySchema>;

/** POST /api/v1/tasks/:id/report (files arrive with the sky-map issue's uploads). */
export const taskReportBodySchema = z.strictObject({
  result: z.string().trim().min(3, "say what you saw, in a few words").max(5000),
});
export type TaskReportBody = z.infer<typeof taskReportBodySchema>;

export const cancelFormSchema = z.object({ reason: z.string().trim().min(3, "say why, in a few words").max(2000) });

/** GET /api/v1/tasks: the follow-up board's filters, also kept in the page URL. */
export const taskListQuerySchema = z.object({
  site: z.string().optional(),
  kind: z.enum(taskKinds).optional().or(z.literal("").transform(() => undefined)),
  candidate: z.string().trim().max(100).optional(),
  mine: z
    .enum(["1", "0", "true", "false"])
    .optional()
    .transform((v) => v === "1" || v === "true"),
  state: z.enum(taskStates).optional(),
});
export type TaskListQuery = z.infer<typeof taskListQuerySchema>;
